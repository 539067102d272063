/**
 * The staff dashboard: grassland converted and restored per year, CO2e committed against the
 * yearly budget, each region's permanent-grassland ratio against its reference with the limit
 * line, conditions and proposals that are due or overdue, and the headroom left per region and in
 * this year's budget. Reads only (no transaction, no audit).
 */
import * as dash from '../db/dashboard';
import { db, type Db } from '../db/client';
import { getProposalSettings } from '../db/proposals';
import { regionStatsWithReference } from '../db/regions';
import {
  budgetLeft,
  changesByYear,
  conditionsByDue,
  conversionPending,
  daysPast,
  regionHeadroom,
} from '../dashboard/figures';
import { citationText } from '../rules';
import { loadRuleSet } from './rule-sets';

/** The ratio rule of the authority's default rule set: the allowed relative fall and where it comes from (null when the set has none). */
async function ratioRule(conn: Db) {
  const set = await loadRuleSet(conn).catch(() => null);
  const rule = set?.document.rules.find((r) => r.kind === 'region-ratio-fall');
  if (!set || !rule) return null;
  return {
    ruleSet: set.ref,
    ruleId: rule.id,
    maxRelativeFall: (rule.params as { aboveRelativeFall: number }).aboveRelativeFall,
    citation: citationText(rule),
  };
}

async function regionRows(conn: Db, today: string, parcels: dash.ApprovedParcelRow[], maxRelativeFall: number | null) {
  const pending = new Map<string, number>();
  for (const p of parcels) {
    if (!p.region || !conversionPending(p)) continue;
    pending.set(p.region, (pending.get(p.region) ?? 0) + p.areaHa);
  }
  const rows = [];
  const { stats, refs } = await regionStatsWithReference(conn, today);
  for (const s of stats) {
    const ref = refs.get(s.key);
    const pendingConvertedHa = pending.get(s.key) ?? 0;
    const h = regionHeadroom({
      agriculturalHa: s.agriculturalHa,
      permanentGrasslandHa: s.permanentGrasslandHa,
      referenceRatio: ref?.ratio ?? null,
      maxRelativeFall,
      pendingConvertedHa,
    });
    rows.push({
      key: s.key,
      label: s.label,
      agriculturalHa: s.agriculturalHa,
      permanentGrasslandHa: s.permanentGrasslandHa,
      pendingConvertedHa,
      referenceRatio: ref?.ratio ?? null,
      referenceYear: ref?.referenceYear ?? null,
      referenceSource: ref?.source ?? null,
      referenceOrigin: ref?.origin ?? null,
      ...h,
    });
  }
  return rows;
}

export async function dashboard(now = new Date(), conn: Db = db) {
  const today = now.toISOString().slice(0, 10);
  const year = now.getUTCFullYear();
  const [parcels, committed, conditions, overdue, settings, rule] = await Promise.all([
    dash.approvedParcels(conn),
    dash.committedByYear(conn),
    dash.conditionsWithDueDates(conn),
    dash.overdueProposals(conn, today),
    getProposalSettings(conn),
    ratioRule(conn),
  ]);
  const budgetT = settings['budget.yearly-co2e-t'];
  const thisYear = committed.find((c) => c.year === year)?.committedT ?? 0;
  const due = conditionsByDue(conditions, today);
  return {
    asOf: today,
    year,
    changes: changesByYear(
      parcels.map((p) => ({
        year: p.year,
        priorLandUse: p.priorLandUse,
        proposedLandUse: p.proposedLandUse,
        areaHa: p.areaHa,
      })),
      year,
    ),
    budget: {
      budgetT,
      years: committed.map((c) => ({ ...c, ...budgetLeft(budgetT, c.committedT) })),
      thisYear: { year, ...budgetLeft(budgetT, thisYear) },
    },
    ratioRule: rule,
    regions: await regionRows(conn, today, parcels, rule?.maxRelativeFall ?? null),
    conditions: {
      open: due.open.length,
      overdue: due.overdue.length,
      items: [...due.overdue, ...due.open].map((c) => ({
        ...c,
        overdue: c.dueDate < today,
        daysPast: daysPast(c.dueDate, today),
      })),
    },
    overdueProposals: overdue.map((p) => ({ ...p, daysOverdue: daysPast(p.decisionDue, today) })),
  };
}
