/**
 * The figures of an assessment from the per-parcel estimate requests (pure): every parcel's
 * estimate exactly as POST /api/estimates gives it, the totals (sum of the parcels), the joint
 * 95 % range, and each alternative estimated in full. Shared by a run and by its reproduction.
 */
import {
  buildPlan,
  estimateBatch,
  estimateLandUseChange,
  estimateRequestSchema,
  linearGroupKey,
  mergeLinearRequests,
  runJointMonteCarlo,
  type EstimateRequest,
  type EstimateResult,
  type FactorSetDocument,
  type LandUseState,
} from '../carbon';
import { canSignOff, tablesUsed, unconfirmedTables } from '../carbon';
import { alternativeSpecs, RESTORED_STATE, type AlternativeKey } from './alternatives';

export type ParcelRequest = EstimateRequest & { factorSet: string; factorSetVersion: number };

export type Totals = {
  areaHa: number;
  socChangeTotal: number;
  biomassChangeTotal: number;
  n2oTotal: number;
  co2eTotal: number;
  co2eLow: number;
  co2eHigh: number;
  runs: number;
  seed: number;
};

export type Alternative = {
  key: AlternativeKey;
  label: string;
  description: string;
  available: boolean;
  note: string | null;
  areaHa: number;
  co2eTotal: number | null;
  co2eLow: number | null;
  co2eHigh: number | null;
  differenceFromProposal: number | null;
};

/** What `POST /api/estimates` answers for a result (see the estimates service), kept pure here. */
function asApi(
  result: EstimateResult,
  set: FactorSetDocument,
  open: Set<string>,
  byFactors?: WeakMap<object, { signOffReady: boolean; unconfirmedTablesUsed: string[] }>,
) {
  let tables = byFactors?.get(result.factors);
  if (!tables) {
    const used = tablesUsed(result.factors);
    tables = { signOffReady: canSignOff(set, used), unconfirmedTablesUsed: used.filter((t) => open.has(t)) };
    byFactors?.set(result.factors, tables);
  }
  return { ...result, signOffReady: tables.signOffReady, unconfirmedTablesUsed: [...tables.unconfirmedTablesUsed] };
}

export type ApiEstimate = ReturnType<typeof asApi>;

/** The API answers for many requests of one set (one plan per kind of request); null where there is no request. */
export function estimatesAsApi(requests: (ParcelRequest | null)[], set: FactorSetDocument): (ApiEstimate | null)[] {
  const open = new Set(unconfirmedTables(set));
  const present = requests.filter((r): r is ParcelRequest => r !== null);
  const results = estimateBatch(present, set);
  // Results of one kind share their factors (estimateBatch): the tables they use are worked out once.
  const byFactors = new WeakMap<object, { signOffReady: boolean; unconfirmedTablesUsed: string[] }>();
  let at = 0;
  return requests.map((r) => (r ? asApi(results[at++]!, set, open, byFactors) : null));
}

/**
 * Point total and joint range of a set of areas: merged by kind of change (linear), one draw per factor per run.
 * `keys` (optional): each request's `linearGroupKey`, when already known.
 */
export function jointTotal(
  requests: EstimateRequest[],
  set: FactorSetDocument,
  runs: number,
  seed: number,
  keys?: readonly string[],
): { co2eTotal: number; co2eLow: number; co2eHigh: number; cautions: string[] } {
  if (requests.length === 0) return { co2eTotal: 0, co2eLow: 0, co2eHigh: 0, cautions: [] };
  // Merged first, then parsed (a handful instead of thousands): requests that merge differ only in area and soils.
  const merged = mergeLinearRequests(requests, keys).map((r) => estimateRequestSchema.parse(r));
  const years = merged[0]!.transitionYears;
  const point = merged.reduce((s, r) => s + estimateLandUseChange(r, set).co2eTotal, 0);
  const mc = runJointMonteCarlo(
    merged.map((r) => ({ plan: buildPlan(r, set), areaHa: r.areaHa })),
    years,
    runs,
    seed,
  );
  return { co2eTotal: point, co2eLow: mc.co2eLow, co2eHigh: mc.co2eHigh, cautions: mc.cautions };
}

export type FigureInput = {
  /** Per parcel: its request, or null when something blocks its estimate. */
  requests: { parcelId: number; areaHa: number; request: ParcelRequest | null }[];
  proposed: LandUseState;
  sharePercent: number;
  /** The restoration offered as compensation, when a parcel was named and can be restored. */
  compensation: { request: ParcelRequest | null; note: string | null } | null;
  runs: number;
  seed: number;
};

/** `mark` (optional) is told when each step ends: estimates, montecarlo, alternatives. */
export function assessmentFigures(input: FigureInput, set: FactorSetDocument, mark?: (step: string) => void) {
  const estimates = estimatesAsApi(
    input.requests.map((p) => p.request),
    set,
  );
  mark?.('estimates');
  const ok = input.requests.flatMap((p) => (p.request ? [p.request] : []));
  const sum = (k: 'socChangeTotal' | 'biomassChangeTotal' | 'n2oTotal' | 'co2eTotal') =>
    estimates.reduce((s, e) => s + (e ? e[k] : 0), 0);
  // Each parcel's group is named once: an alternative changes the after state alike for every parcel of a
  // group (it depends on the states only), so a group's new key is worked out from its first parcel.
  const keys = ok.map(linearGroupKey);
  const keysAfter = (reqs: EstimateRequest[]) => {
    const renamed = new Map<string, string>();
    return keys.map((k, i) => renamed.get(k) ?? renamed.set(k, linearGroupKey(reqs[i]!)).get(k)!);
  };
  const joint = jointTotal(ok, set, input.runs, input.seed, keys);
  mark?.('montecarlo');
  const totals: Totals = {
    areaHa: input.requests.reduce((s, p) => s + p.areaHa, 0),
    socChangeTotal: sum('socChangeTotal'),
    biomassChangeTotal: sum('biomassChangeTotal'),
    n2oTotal: sum('n2oTotal'),
    co2eTotal: sum('co2eTotal'),
    co2eLow: joint.co2eLow,
    co2eHigh: joint.co2eHigh,
    runs: input.runs,
    seed: input.seed,
  };
  const alternatives: Alternative[] = alternativeSpecs(input.proposed, input.sharePercent).map(
    ({ spec, unavailable }) => {
      const base = { key: spec.key, label: spec.label, description: spec.description };
      if (unavailable)
        return {
          ...base,
          available: false,
          note: unavailable,
          areaHa: 0,
          co2eTotal: null,
          co2eLow: null,
          co2eHigh: null,
          differenceFromProposal: null,
        };
      const reqs = ok.map((r) => ({
        ...r,
        after: spec.after ? spec.after(r.after, r.before) : r.after,
        areaHa: r.areaHa * spec.areaShare,
      }));
      const t =
        spec.key === 'proposal'
          ? joint
          : jointTotal(reqs, set, input.runs, input.seed, spec.after ? keysAfter(reqs) : keys);
      return {
        ...base,
        available: true,
        note: null,
        areaHa: reqs.reduce((s, r) => s + r.areaHa, 0),
        co2eTotal: t.co2eTotal,
        co2eLow: t.co2eLow,
        co2eHigh: t.co2eHigh,
        differenceFromProposal: t.co2eTotal - joint.co2eTotal,
      };
    },
  );
  if (input.compensation) {
    const c = input.compensation;
    const base = {
      key: 'compensation' as const,
      label: 'With compensation',
      description: 'The proposal, and a named cropland parcel restored to grassland.',
    };
    if (!c.request)
      alternatives.push({
        ...base,
        available: false,
        note: c.note,
        areaHa: 0,
        co2eTotal: null,
        co2eLow: null,
        co2eHigh: null,
        differenceFromProposal: null,
      });
    else {
      const t = jointTotal([...ok, c.request], set, input.runs, input.seed, [...keys, linearGroupKey(c.request)]);
      alternatives.push({
        ...base,
        note: c.note,
        available: true,
        areaHa: totals.areaHa + c.request.areaHa,
        co2eTotal: t.co2eTotal,
        co2eLow: t.co2eLow,
        co2eHigh: t.co2eHigh,
        differenceFromProposal: t.co2eTotal - joint.co2eTotal,
      });
    }
  }
  mark?.('alternatives');
  return { estimates, totals, alternatives, jointCautions: joint.cautions };
}

export { RESTORED_STATE };
