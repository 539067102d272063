import { xoroshiro128plus } from 'pure-rand/generator/xoroshiro128plus';
import { computeFigures } from './compute';
import type { Plan } from './plan';
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
  const rng = xoroshiro128plus(seed);
  const sampled: { key: string; value: number; spread: { below: number; above: number } }[] = [];
  const fixed: string[] = [];
  const standIns: string[] = [];
  for (const f of plan.factors.values()) {
    const spread = FIXED_TABLES.has(f.table) ? null : spreadOf(f.value, f.uncertainty);
    if (spread) sampled.push({ key: f.key, value: f.value, spread });
    else if (f.uncertainty.kind !== 'none' || !f.uncertainty.reason.startsWith('Reference level')) fixed.push(f.key);
    if ('standIn' in f.uncertainty && f.uncertainty.standIn && spread) standIns.push(f.key);
  }

  const draw = new Map<string, number>();
  const value = (k: string) => draw.get(k) ?? plan.factors.get(k)!.value;
  const samples: number[] = [];
  for (let i = 0; i < runs; i++) {
    for (const s of sampled) draw.set(s.key, drawTruncated(rng, s.value, s.spread));
    samples.push(computeFigures(plan, areaHa, years, value).co2eTotal);
  }
  const sorted = [...samples].sort((a, b) => a - b);

  const cautions = [
    `Uncertainty: 95% range (2.5th to 97.5th percentile) of ${runs} Monte Carlo runs, seed ${seed}, over ${sampled.length} sampled values; it reflects the published default ranges only, not site conditions.`,
  ];
  if (fixed.length > 0) cautions.push(`Held fixed in the Monte Carlo runs (no range to sample, or a metric): ${fixed.join(', ')}.`);
  if (standIns.length > 0)
    cautions.push(`Uncertainty of these values is a stand-in (this set's own range was not available; see each table's note): ${standIns.join(', ')}.`);
  return { co2eLow: percentile(sorted, 0.025), co2eHigh: percentile(sorted, 0.975), runs, seed, samples, cautions };
}
