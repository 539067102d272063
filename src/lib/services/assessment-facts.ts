/**
 * The facts a rule reads about a proposal (see rules/facts.ts), gathered from the assessed
 * parcels, their estimates, the regions' permanent-grassland figures, the holdings' earlier
 * proposals and the authority's carbon budget.
 */
import type { FactorSetDocument, LandUseState } from '../carbon';
import * as store from '../db/assessments';
import type { Db } from '../db/client';
import type { ProposalRow } from '../db/proposals';
import { regionStatsWithReference } from '../db/regions';
import { committedCo2e } from '../db/register';
import type { LandUseFlags } from '../gis/land-use-history';
import { summariseOverlay, type OverlayRow } from '../gis/overlay-summary';
import type { ProposalSettings } from '../proposals/settings';
import { holdingWindowYears, type GradeFacts, type ParcelFacts, type RuleSetDocument, type ShareFacts } from '../rules';
import { regionFacts } from '../rules/region-facts';

type AssessedParcel = {
  parcelId: number;
  reference: string;
  areaHa: number;
  ownerRef: string | null;
  state: LandUseState | null;
  overlayRows: OverlayRow[];
  /** `summariseOverlay(overlayRows)` when the caller has it already. */
  overlaySummary?: ReturnType<typeof summariseOverlay>;
  flags: LandUseFlags;
};
type Estimate = { socBeforePerHa: number; socAfterPerHa: number; socChangeTotal: number; co2eTotal: number } | null;

const DEFAULT_WINDOW_YEARS = 5;
const shareOf = (rows: { share: number; areaHa: number }[]): ShareFacts => ({
  share: Math.min(
    1,
    rows.reduce((s, c) => s + c.share, 0),
  ),
  areaHa: rows.reduce((s, c) => s + c.areaHa, 0),
});

export async function buildGradeFacts(
  conn: Db,
  a: {
    proposal: ProposalRow;
    parcels: AssessedParcel[];
    estimates: Estimate[];
    totals: { areaHa: number; socChangeTotal: number; co2eTotal: number; co2eHigh: number };
    settings: ProposalSettings;
    rules: RuleSetDocument;
    set?: FactorSetDocument;
  },
): Promise<GradeFacts> {
  const converts = a.proposal.proposed.landUse !== 'grassland';
  const parcels: ParcelFacts[] = a.parcels.map((p, i) => {
    const o = (p.overlaySummary ?? summariseOverlay(p.overlayRows)) as Record<
      string,
      ReturnType<typeof summariseOverlay>[keyof ReturnType<typeof summariseOverlay>]
    >;
    const e = a.estimates[i];
    const slope = Object.fromEntries(
      (o.slope?.classes ?? []).map((c) => [c.class, { share: c.share, areaHa: c.share * p.areaHa }]),
    );
    return {
      parcelId: p.parcelId,
      reference: p.reference,
      areaHa: p.areaHa,
      ownerRef: p.ownerRef,
      regionKey: o.region?.dominant ?? null,
      sensitive: shareOf((o.sensitive?.classes ?? []).map((c) => ({ share: c.share, areaHa: c.share * p.areaHa }))),
      neverTilledLayer: shareOf(
        (o['never-tilled']?.classes ?? []).map((c) => ({ share: c.share, areaHa: c.share * p.areaHa })),
      ),
      slope,
      flags: {
        permanentGrassland: p.flags.permanentGrassland.value,
        uncultivated: p.flags.uncultivated.value,
        neverTilled: p.flags.neverTilled.value,
      },
      socLossPerHa: e ? -e.socChangeTotal / p.areaHa : 0,
      socLossShare: e && e.socBeforePerHa > 0 ? (e.socBeforePerHa - e.socAfterPerHa) / e.socBeforePerHa : 0,
      co2eTotal: e?.co2eTotal ?? 0,
    };
  });
  // Permanent grassland this proposal converts: parcels out of grassland whose history makes them permanent grassland.
  const pgConverted = (p: ParcelFacts, i: number) =>
    converts && a.parcels[i]!.state?.landUse === 'grassland' && p.flags.permanentGrassland === true ? p.areaHa : 0;
  const convertedByRegion = new Map<string, number>();
  parcels.forEach(
    (p, i) =>
      p.regionKey && convertedByRegion.set(p.regionKey, (convertedByRegion.get(p.regionKey) ?? 0) + pgConverted(p, i)),
  );
  const keys = [...convertedByRegion.keys()];
  // Figures now and the reference ratios from one read of the touched regions' history.
  const { stats, refs } = keys.length
    ? await regionStatsWithReference(conn, new Date().toISOString().slice(0, 10), keys)
    : { stats: [], refs: new Map() };
  const regions = [];
  for (const s of stats) {
    const ref = refs.get(s.key);
    regions.push(
      regionFacts(
        s,
        ref ? { ratio: ref.ratio, referenceYear: ref.referenceYear } : null,
        convertedByRegion.get(s.key) ?? 0,
      ),
    );
  }

  const windowYears = holdingWindowYears(a.rules) ?? DEFAULT_WINDOW_YEARS;
  const byHolding = new Map<string, number>();
  parcels.forEach(
    (p, i) => p.ownerRef && byHolding.set(p.ownerRef, (byHolding.get(p.ownerRef) ?? 0) + pgConverted(p, i)),
  );
  const earlier = byHolding.size
    ? await store.earlierOnHoldings(conn, a.proposal.id, [...byHolding.keys()], windowYears)
    : [];
  const earlierOf = new Map<string, typeof earlier>();
  for (const e of earlier) {
    const list = earlierOf.get(e.owner_ref);
    if (list) list.push(e);
    else earlierOf.set(e.owner_ref, [e]);
  }
  const holdings = [...byHolding.entries()].map(([ownerRef, thisHa]) => {
    const rows = earlierOf.get(ownerRef) ?? [];
    const earlierHa = rows.reduce((s, r) => s + Number(r.area_ha), 0);
    return {
      ownerRef,
      windowYears,
      thisProposalHa: thisHa,
      earlierHa,
      cumulativeHa: thisHa + earlierHa,
      earlierReferences: rows.map((r) => r.reference),
    };
  });

  const budgetT = a.settings['budget.yearly-co2e-t'];
  const areaHa = a.totals.areaHa;
  const socBefore = parcels.reduce((s, p, i) => s + (a.estimates[i]?.socBeforePerHa ?? 0) * p.areaHa, 0);
  return {
    proposalReference: a.proposal.reference,
    converts,
    parcels,
    totals: {
      areaHa,
      socLossPerHa: areaHa > 0 ? -a.totals.socChangeTotal / areaHa : 0,
      socLossShare: socBefore > 0 ? -a.totals.socChangeTotal / socBefore : 0,
      co2eTotal: a.totals.co2eTotal,
      co2eHigh: a.totals.co2eHigh,
      permanentGrasslandConvertedHa: parcels.reduce((s, p, i) => s + pgConverted(p, i), 0),
    },
    regions,
    holdings,
    // Committed: the CO2e of approvals in the register (current entries) for proposals starting that year.
    budget: {
      year: a.proposal.start_year,
      budgetT,
      committedT: await committedCo2e(conn, a.proposal.start_year),
      proposalShare: budgetT ? a.totals.co2eTotal / budgetT : null,
    },
  };
}

/** The facts as shown to users: holding references replaced by neutral labels. */
export function publicFacts(f: GradeFacts): Record<string, unknown> {
  const label = new Map(f.holdings.map((h, i) => [h.ownerRef, `holding ${i + 1}`]));
  return {
    ...f,
    parcels: f.parcels.map((p) => ({ ...p, ownerRef: p.ownerRef ? (label.get(p.ownerRef) ?? 'a holding') : null })),
    holdings: f.holdings.map((h) => ({ ...h, ownerRef: label.get(h.ownerRef)! })),
  };
}
