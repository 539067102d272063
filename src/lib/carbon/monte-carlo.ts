import { xoroshiro128plus } from 'pure-rand/generator/xoroshiro128plus';
import { computeFigures } from './compute';
import type { Plan } from './plan';
import type { PlanFactor } from './resolver';
import { drawTruncated, percentile, spreadOf } from './sampling';

export interface MonteCarloResult {
  /** 2.5th and 97.5th percentiles of co2eTotal, t CO2e. */
  co2eLow: number;
  co2eHigh: number;
  runs: number;
  seed: number;
  /** co2eTotal of every run, in run order (t CO2e). */
  samples: number[];
  cautions: string[];
}

/** Tables whose values are metrics, not estimates: held fixed (common practice). */
const FIXED_TABLES = new Set(['gwp']);

/**
 * IPCC Approach 2 (2006 IPCC Guidelines Vol 1 Ch 3, Monte Carlo simulation): each factor
 * the plan uses is drawn once per run from a normal distribution truncated at zero, built
 * from its published uncertainty (see sampling.ts); the same factor feeds every term that
 * uses it in that run. `runs` runs with the seeded xoroshiro128+ generator of pure-rand, so
 * the same plan, runs and seed always give the same range.
 */
export function runMonteCarlo(plan: Plan, areaHa: number, years: number, runs: number, seed: number): MonteCarloResult {
  return runJointMonteCarlo([{ plan, areaHa }], years, runs, seed);
}

/** One area of a joint estimate: its plan (factors and arithmetic) and its size. */
export type JointItem = { plan: Plan; areaHa: number };

/** Items whose plans are the same calculation (all but the area): estimates are linear in area, so they share one computation per run. */
function groupByPlan(items: JointItem[]): JointItem[] {
  const groups = new Map<string, JointItem>();
  for (const it of items) {
    const { factors, ...shape } = it.plan;
    const key = JSON.stringify([shape, [...factors.keys()]]);
    const g = groups.get(key);
    if (g) g.areaHa += it.areaHa;
    else groups.set(key, { plan: it.plan, areaHa: it.areaHa });
  }
  return [...groups.values()];
}

/**
 * Joint Monte Carlo over several areas computed with ONE factor set: in each run every factor
 * is drawn once and the same draw is used for every area (IPCC 2006 Vol 1 Ch 3 §3.2.3: a
 * default factor is one uncertain quantity for the whole inventory, so its error is fully
 * correlated across the areas that use it). The run's total is the sum over the areas.
 * Adding per-area ranges, or drawing each area on its own, would misstate the total's range.
 * Factors are drawn in the order they first appear in the items, so one item gives exactly
 * the runs of `runMonteCarlo` for it.
 */
export function runJointMonteCarlo(items: JointItem[], years: number, runs: number, seed: number): MonteCarloResult {
  const rng = xoroshiro128plus(seed);
  const all = new Map<string, PlanFactor>();
  for (const it of items) for (const [k, f] of it.plan.factors) if (!all.has(k)) all.set(k, f);
  const sampled: { key: string; value: number; spread: { below: number; above: number } }[] = [];
  const fixed: string[] = [];
  const standIns: string[] = [];
  for (const f of all.values()) {
    const spread = FIXED_TABLES.has(f.table) ? null : spreadOf(f.value, f.uncertainty);
    if (spread) sampled.push({ key: f.key, value: f.value, spread });
    else if (f.uncertainty.kind !== 'none' || !f.uncertainty.reason.startsWith('Reference level')) fixed.push(f.key);
    if ('standIn' in f.uncertainty && f.uncertainty.standIn && spread) standIns.push(f.key);
  }

  const groups = groupByPlan(items.map((it) => ({ ...it })));
  const draw = new Map<string, number>();
  const value = (k: string) => draw.get(k) ?? all.get(k)!.value;
  const samples: number[] = [];
  for (let i = 0; i < runs; i++) {
    for (const s of sampled) draw.set(s.key, drawTruncated(rng, s.value, s.spread));
    let total = 0;
    for (const g of groups) total += computeFigures(g.plan, g.areaHa, years, value).co2eTotal;
    samples.push(total);
  }
  const sorted = [...samples].sort((a, b) => a - b);

  const cautions = [
    `Uncertainty: 95% range (2.5th to 97.5th percentile) of ${runs} Monte Carlo runs, seed ${seed}, ` +
      `over ${sampled.length} sampled values; it reflects the published default ranges only, not site conditions.`,
  ];
  if (items.length > 1)
    cautions.push(
      `The range is joint: in each run every factor took one value for all ${items.length} areas, as the same default applies to all of them.`,
    );
  if (fixed.length > 0)
    cautions.push(`Held fixed in the Monte Carlo runs (no range to sample, or a metric): ${fixed.join(', ')}.`);
  if (standIns.length > 0)
    cautions.push(
      `Uncertainty of these values is a stand-in (this set's own range was not available; see each table's note): ${standIns.join(', ')}.`,
    );
  return { co2eLow: percentile(sorted, 0.025), co2eHigh: percentile(sorted, 0.975), runs, seed, samples, cautions };
}

/**
 * The runs of several areas with shared draws, kept apart: in run i every factor takes one value
 * for all the areas, and `perItem[k][i]` is area k's CO2e in that run. Any weighted sum of the
 * items' runs is then the run of that combination (estimates are linear in area for a given set
 * of draws), which lets many parcels share the runs of a few unit areas.
 */
export function jointSamplesPerItem(items: JointItem[], years: number, runs: number, seed: number): Float64Array[] {
  const rng = xoroshiro128plus(seed);
  const all = new Map<string, PlanFactor>();
  for (const it of items) for (const [k, f] of it.plan.factors) if (!all.has(k)) all.set(k, f);
  const sampled = [...all.values()].flatMap((f) => {
    const spread = FIXED_TABLES.has(f.table) ? null : spreadOf(f.value, f.uncertainty);
    return spread ? [{ key: f.key, value: f.value, spread }] : [];
  });
  const draw = new Map<string, number>();
  const value = (k: string) => draw.get(k) ?? all.get(k)!.value;
  const out = items.map(() => new Float64Array(runs));
  for (let i = 0; i < runs; i++) {
    for (const s of sampled) draw.set(s.key, drawTruncated(rng, s.value, s.spread));
    items.forEach((it, k) => (out[k]![i] = computeFigures(it.plan, it.areaHa, years, value).co2eTotal));
  }
  return out;
}
