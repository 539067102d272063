/**
 * The kinds of rule the code knows how to evaluate over GradeFacts (pure). A rule set is data:
 * each of its rules names one of these kinds with the threshold values it uses. To add a kind,
 * add its parameter schema and evaluator here (see DEVELOPERS.md "How to add a rule kind").
 */
import { z } from 'zod';
import type { GradeFacts } from './facts';
import { atLeast, fmtHa, fmtPct, fmtRatio, fmtT, fmtT1, listWords, moreThan } from './format';

export type Evaluation = { fired: true; text: string } | { fired: false; undecided?: string };

const share = z.number().min(0).max(1);
const positive = z.number().nonnegative();

export const RULE_KIND_PARAMS = {
  /** Any parcel's share in designated sensitive grassland above `aboveShare`. */
  'sensitive-share': z.strictObject({ aboveShare: share }),
  /** A region's permanent-grassland ratio after the proposal more than `aboveRelativeFall` below its reference. */
  'region-ratio-fall': z.strictObject({ aboveRelativeFall: share }),
  /** Permanent grassland converted on one holding, this proposal plus earlier ones within `windowYears`, at least `atLeastHa`. */
  'holding-cumulative-area': z.strictObject({ atLeastHa: positive, windowYears: z.number().int().positive().max(50) }),
  /** Never-tilled grassland: the land-use flag (when `useFlag`) or the reference layer's share above `aboveShare`. */
  'never-tilled': z.strictObject({ aboveShare: share, useFlag: z.boolean() }),
  /** Any of the listed slope classes with a share above `aboveShare`. */
  'slope-class': z.strictObject({ classes: z.array(z.string().min(1)).min(1), aboveShare: share }),
  /** Soil-carbon loss per hectare of the assessed area above the threshold. */
  'soc-loss-per-ha': z.strictObject({ aboveTonnesCPerHa: positive }),
  /** Total CO2e (central estimate or upper bound of its 95 % range) above the threshold. */
  'co2e-total': z.strictObject({ aboveTonnesCo2e: positive, basis: z.enum(['central', 'upper']) }),
  /** Share of the authority's yearly carbon budget the proposal would use above the threshold. */
  'budget-share': z.strictObject({ aboveShare: z.number().nonnegative() }),
} as const;

export type RuleKind = keyof typeof RULE_KIND_PARAMS;
export const RULE_KINDS = Object.keys(RULE_KIND_PARAMS) as RuleKind[];
export type RuleParams<K extends RuleKind> = z.output<(typeof RULE_KIND_PARAMS)[K]>;

/** What each kind reads, in words, for the admin pages. */
export const RULE_KIND_LABELS: Record<RuleKind, string> = {
  'sensitive-share': 'Share in designated sensitive grassland',
  'region-ratio-fall': "Fall of the region's permanent-grassland ratio",
  'holding-cumulative-area': 'Permanent grassland converted on one holding, added up',
  'never-tilled': 'Never-tilled grassland',
  'slope-class': 'Slope classes',
  'soc-loss-per-ha': 'Soil-carbon loss per hectare',
  'co2e-total': 'Total CO2e',
  'budget-share': "Share of the year's carbon budget",
};

type Evaluator<K extends RuleKind> = (p: RuleParams<K>, f: GradeFacts) => Evaluation;

const sensitive: Evaluator<'sensitive-share'> = (p, f) => {
  const hits = f.parcels.filter((x) => moreThan(x.sensitive.share, p.aboveShare));
  if (hits.length === 0) return { fired: false };
  const total = hits.reduce((s, x) => s + x.sensitive.areaHa, 0);
  const parts = hits.map(
    (x) => `${x.reference}: ${fmtHa(x.sensitive.areaHa)}, ${fmtPct(x.sensitive.share)} of the area assessed`,
  );
  return {
    fired: true,
    text: `${fmtHa(total)} of the proposal lies in designated sensitive grassland (${parts.join('; ')}); the rule fires above ${fmtPct(p.aboveShare)}.`,
  };
};

const regionFall: Evaluator<'region-ratio-fall'> = (p, f) => {
  const touched = f.regions.filter((r) => r.convertedHa > 0);
  const hits = touched.filter(
    (r) => r.relativeFallAfter !== null && moreThan(r.relativeFallAfter, p.aboveRelativeFall),
  );
  if (hits.length > 0) {
    const parts = hits.map(
      (r) =>
        `in ${r.label} the permanent-grassland ratio would be ${fmtRatio(r.ratioAfter!)} after ` +
        `converting ${fmtHa(r.convertedHa)}, ${fmtPct(r.relativeFallAfter!)} below its reference ` +
        `ratio ${fmtRatio(r.referenceRatio!)}${r.referenceYear ? ` of ${r.referenceYear}` : ''}`,
    );
    return {
      fired: true,
      text: `${capitalise(listWords(parts))}; the limit is a fall of more than ${fmtPct(p.aboveRelativeFall)}.`,
    };
  }
  const open = touched.filter((r) => r.relativeFallAfter === null);
  if (open.length > 0)
    return {
      fired: false,
      undecided: `No reference ratio is known for ${listWords(open.map((r) => r.label))}, so the fall of the permanent-grassland ratio cannot be checked.`,
    };
  return { fired: false };
};

const holding: Evaluator<'holding-cumulative-area'> = (p, f) => {
  const hits = f.holdings.filter((h) => atLeast(h.cumulativeHa, p.atLeastHa));
  if (hits.length === 0) return { fired: false };
  // Never the holding reference (personal data): only areas and public proposal references.
  const parts = hits.map((h) =>
    h.earlierHa > 0
      ? `on one holding this proposal converts ${fmtHa(h.thisProposalHa)} of permanent grassland and earlier ` +
        `proposals within ${h.windowYears} years (${listWords(h.earlierReferences)}) converted ${fmtHa(h.earlierHa)}, together ${fmtHa(h.cumulativeHa)}`
      : `on one holding this proposal converts ${fmtHa(h.cumulativeHa)} of permanent grassland`,
  );
  return {
    fired: true,
    text: `${capitalise(listWords(parts))}; the screening threshold is ${fmtHa(p.atLeastHa)} or more, added up over ${p.windowYears} years.`,
  };
};

const neverTilled: Evaluator<'never-tilled'> = (p, f) => {
  const byFlag = p.useFlag ? f.parcels.filter((x) => x.flags.neverTilled === true) : [];
  const byLayer = f.parcels.filter((x) => moreThan(x.neverTilledLayer.share, p.aboveShare));
  if (byFlag.length === 0 && byLayer.length === 0) return { fired: false };
  const parts: string[] = [];
  if (byFlag.length)
    parts.push(`the recorded history shows no tillage or arable use on ${listWords(byFlag.map((x) => x.reference))}`);
  if (byLayer.length)
    parts.push(
      `the never-tilled grassland layer covers ${listWords(
        byLayer.map(
          (x) => `${fmtHa(x.neverTilledLayer.areaHa)} ` + `(${fmtPct(x.neverTilledLayer.share)}) of ${x.reference}`,
        ),
      )}`,
    );
  return { fired: true, text: `${capitalise(parts.join('; '))}.` };
};

const slope: Evaluator<'slope-class'> = (p, f) => {
  const parts: string[] = [];
  for (const x of f.parcels) {
    for (const cls of p.classes) {
      const s = x.slope[cls];
      if (s && moreThan(s.share, p.aboveShare))
        parts.push(`${fmtHa(s.areaHa)} (${fmtPct(s.share)}) of ${x.reference} is in slope class "${cls}"`);
    }
  }
  if (parts.length === 0) return { fired: false };
  return {
    fired: true,
    text: `${capitalise(listWords(parts))}; the rule covers the classes ${listWords(p.classes.map((c) => `"${c}"`))}.`,
  };
};

const socPerHa: Evaluator<'soc-loss-per-ha'> = (p, f) => {
  if (!moreThan(f.totals.socLossPerHa, p.aboveTonnesCPerHa)) return { fired: false };
  return {
    fired: true,
    text:
      `The soil-carbon loss averages ${fmtT1(f.totals.socLossPerHa)} t C/ha over the ${fmtHa(f.totals.areaHa)} ` +
      `assessed, more than ${fmtT1(p.aboveTonnesCPerHa)} t C/ha.`,
  };
};

const co2e: Evaluator<'co2e-total'> = (p, f) => {
  const value = p.basis === 'upper' ? f.totals.co2eHigh : f.totals.co2eTotal;
  if (!moreThan(value, p.aboveTonnesCo2e)) return { fired: false };
  const what = p.basis === 'upper' ? 'The upper bound of the 95 % range of the total' : 'The total';
  return { fired: true, text: `${what} is ${fmtT(value)} t CO2e, more than ${fmtT(p.aboveTonnesCo2e)} t CO2e.` };
};

const budget: Evaluator<'budget-share'> = (p, f) => {
  const b = f.budget;
  if (b.proposalShare === null || b.budgetT === null)
    return {
      fired: false,
      undecided: `No carbon budget is set for ${b.year}, so the share of it this proposal would use cannot be checked.`,
    };
  if (!moreThan(b.proposalShare, p.aboveShare)) return { fired: false };
  return {
    fired: true,
    text:
      `The proposal would use ${fmtPct(b.proposalShare)} of the ${b.year} carbon budget of ${fmtT(b.budgetT)} ` +
      `t CO2e (${fmtT(b.committedT)} t already committed); the rule fires above ${fmtPct(p.aboveShare)}.`,
  };
};

const EVALUATORS: { [K in RuleKind]: Evaluator<K> } = {
  'sensitive-share': sensitive,
  'region-ratio-fall': regionFall,
  'holding-cumulative-area': holding,
  'never-tilled': neverTilled,
  'slope-class': slope,
  'soc-loss-per-ha': socPerHa,
  'co2e-total': co2e,
  'budget-share': budget,
};

export function evaluateKind<K extends RuleKind>(kind: K, params: RuleParams<K>, facts: GradeFacts): Evaluation {
  return (EVALUATORS[kind] as Evaluator<K>)(params, facts);
}

function capitalise(s: string): string {
  return s.charAt(0).toUpperCase() + s.slice(1);
}
