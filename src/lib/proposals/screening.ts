/**
 * The screening map (pure): for every permanent-grassland parcel, the risk level and CO2e that
 * converting it to full-tillage cropland would get. Parcels of one climate region share one set
 * of Monte Carlo runs: the runs are made once per soil class for one hectare (shared draws), and
 * each parcel's runs are its area-weighted sum of them (the estimate is linear in area for given
 * draws and, for one climate and one pair of states, in the area of each soil class).
 */
import {
  buildPlan,
  estimateLandUseChange,
  estimateRequestSchema,
  EstimateInputError,
  jointSamplesPerItem,
  type EstimateRequest,
  type FactorSetDocument,
  type LandUseState,
} from '../carbon';
import {
  gradeProposal,
  levelInfo,
  type GradeFacts,
  type ParcelFacts,
  type RegionFacts,
  type RuleSetDocument,
} from '../rules';

export const SCREENING_AFTER: LandUseState = {
  landUse: 'cropland',
  system: 'long-term-cultivated',
  tillage: 'full',
  input: 'medium',
};
export const SCREENING_BEFORE: LandUseState = { landUse: 'grassland', management: 'nominal', input: 'medium' };
const YEARS = 20;

export type ScreeningParcel = Omit<ParcelFacts, 'socLossPerHa' | 'socLossShare' | 'co2eTotal'> & {
  climate: string | null;
  soils: { type: string; fraction: number }[];
};

export type ScreeningResult = {
  parcelId: number;
  level: number | null;
  label: string | null;
  co2eTotal: number | null;
  co2eHigh: number | null;
  socLossPerHa: number | null;
  rules: string[];
  problem: string | null;
};

type Unit =
  | {
      point: { co2eTotal: number; socChangeTotal: number; socBeforePerHa: number; socAfterPerHa: number };
      runs: Float64Array;
    }
  | { problem: string };

/** One hectare of each soil class in each climate region, with shared draws per region. */
function unitRuns(
  parcels: ScreeningParcel[],
  set: FactorSetDocument,
  gwp: string,
  runs: number,
  seed: number,
): Map<string, Unit> {
  const byClimate = new Map<string, Set<string>>();
  for (const p of parcels)
    if (p.climate)
      for (const s of p.soils) byClimate.set(p.climate, (byClimate.get(p.climate) ?? new Set()).add(s.type));
  const units = new Map<string, Unit>();
  for (const [climate, types] of byClimate) {
    const ok: { key: string; req: EstimateRequest }[] = [];
    for (const type of [...types].sort()) {
      const key = `${climate}|${type}`;
      try {
        const req = estimateRequestSchema.parse({
          factorSet: set.id,
          climate,
          soils: [{ type, fraction: 1 }],
          areaHa: 1,
          before: SCREENING_BEFORE,
          after: SCREENING_AFTER,
          gwp,
        });
        const e = estimateLandUseChange(req, set);
        units.set(key, { point: e, runs: new Float64Array(0) });
        ok.push({ key, req });
      } catch (err) {
        if (!(err instanceof EstimateInputError)) throw err;
        units.set(key, { problem: err.issues.map((i) => i.message).join(' ') });
      }
    }
    const samples = jointSamplesPerItem(
      ok.map((o) => ({ plan: buildPlan(o.req, set), areaHa: 1 })),
      YEARS,
      runs,
      seed,
    );
    ok.forEach((o, i) => ((units.get(o.key) as { runs: Float64Array }).runs = samples[i]!));
  }
  return units;
}

export type ScreeningContext = {
  set: FactorSetDocument;
  gwp: string;
  runs: number;
  seed: number;
  rules: { document: RuleSetDocument; ref: { id: string; version: number } };
  regions: Map<string, (convertedHa: number) => RegionFacts>;
  earlierOnHolding: Map<string, { ha: number; references: string[] }>;
  windowYears: number;
  budget: { year: number; budgetT: number | null; committedT: number };
};

export function screenParcels(parcels: ScreeningParcel[], ctx: ScreeningContext): ScreeningResult[] {
  const units = unitRuns(parcels, ctx.set, ctx.gwp, ctx.runs, ctx.seed);
  const runs = new Float64Array(ctx.runs);
  const scratch = new Float64Array(ctx.runs);
  return parcels.map((p) => {
    const none = {
      parcelId: p.parcelId,
      level: null,
      label: null,
      co2eTotal: null,
      co2eHigh: null,
      socLossPerHa: null,
      rules: [],
    };
    if (!p.climate || p.soils.length === 0)
      return { ...none, problem: 'The parcel is not wholly inside the climate and soil layers.' };
    let co2e = 0,
      soc = 0,
      before = 0,
      after = 0;
    runs.fill(0);
    for (const s of p.soils) {
      const u = units.get(`${p.climate}|${s.type}`)!;
      if ('problem' in u) return { ...none, problem: u.problem };
      const ha = p.areaHa * s.fraction;
      co2e += u.point.co2eTotal * ha;
      soc += u.point.socChangeTotal * ha;
      before += u.point.socBeforePerHa * ha;
      after += u.point.socAfterPerHa * ha;
      for (let i = 0; i < runs.length; i++) runs[i]! += u.runs[i]! * ha;
    }
    const high = percentileInPlace(scratch, runs, 0.975);
    const facts = factsFor(p, { co2e, soc, before, after, high }, ctx);
    const grade = gradeProposal(facts, ctx.rules.document, ctx.rules.ref);
    return {
      parcelId: p.parcelId,
      level: grade.level,
      label: levelInfo(grade.level).label,
      co2eTotal: co2e,
      co2eHigh: high,
      socLossPerHa: -soc / p.areaHa,
      rules: grade.reasons.map((r) => r.rule),
      problem: null,
    };
  });
}

/** The p-quantile of `values` with linear interpolation (as carbon/sampling.ts `percentile`), by selection in `scratch` (no sort, no allocation). */
export function percentileInPlace(scratch: Float64Array, values: Float64Array, p: number): number {
  scratch.set(values);
  const h = (values.length - 1) * p;
  const lo = Math.floor(h);
  const a = select(scratch, lo);
  if (lo + 1 >= values.length || h === lo) return a;
  // The next order statistic is the smallest value right of position lo after selection.
  let b = Infinity;
  for (let i = lo + 1; i < scratch.length; i++) if (scratch[i]! < b) b = scratch[i]!;
  return a + (h - lo) * (b - a);
}

/** Hoare's quickselect: puts the k-th smallest at index k, smaller ones left of it, larger right. */
function select(x: Float64Array, k: number): number {
  let [left, right] = [0, x.length - 1];
  while (left < right) {
    const pivot = x[(left + right) >> 1]!;
    let [i, j] = [left, right];
    while (i <= j) {
      while (x[i]! < pivot) i++;
      while (x[j]! > pivot) j--;
      if (i <= j) {
        const t = x[i]!;
        x[i] = x[j]!;
        x[j] = t;
        i++;
        j--;
      }
    }
    if (k <= j) right = j;
    else if (k >= i) left = i;
    else return x[k]!;
  }
  return x[k]!;
}

function factsFor(
  p: ScreeningParcel,
  f: { co2e: number; soc: number; before: number; after: number; high: number },
  ctx: ScreeningContext,
): GradeFacts {
  const { climate: _c, soils: _s, ...rest } = p;
  const parcel: ParcelFacts = {
    ...rest,
    socLossPerHa: -f.soc / p.areaHa,
    socLossShare: f.before > 0 ? (f.before - f.after) / f.before : 0,
    co2eTotal: f.co2e,
  };
  const earlier = p.ownerRef ? ctx.earlierOnHolding.get(p.ownerRef) : undefined;
  return {
    proposalReference: `screening of ${p.reference}`,
    converts: true,
    parcels: [parcel],
    totals: {
      areaHa: p.areaHa,
      socLossPerHa: parcel.socLossPerHa,
      socLossShare: parcel.socLossShare,
      co2eTotal: f.co2e,
      co2eHigh: f.high,
      permanentGrasslandConvertedHa: p.areaHa,
    },
    regions: p.regionKey && ctx.regions.has(p.regionKey) ? [ctx.regions.get(p.regionKey)!(p.areaHa)] : [],
    holdings: p.ownerRef
      ? [
          {
            ownerRef: p.ownerRef,
            windowYears: ctx.windowYears,
            thisProposalHa: p.areaHa,
            earlierHa: earlier?.ha ?? 0,
            cumulativeHa: p.areaHa + (earlier?.ha ?? 0),
            earlierReferences: earlier?.references ?? [],
          },
        ]
      : [],
    budget: { ...ctx.budget, proposalShare: ctx.budget.budgetT ? f.co2e / ctx.budget.budgetT : null },
  };
}
