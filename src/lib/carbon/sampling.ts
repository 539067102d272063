import { uniformFloat64 } from 'pure-rand/distribution/uniformFloat64';
import type { RandomGenerator } from 'pure-rand/types/RandomGenerator';
import type { Uncertainty } from './factor-set-schema';

/** Standard normal draw by the Box-Muller transform from two uniform draws of `rng`. */
export function standardNormal(rng: RandomGenerator): number {
  const u1 = 1 - uniformFloat64(rng); // (0, 1]: log is finite
  const u2 = uniformFloat64(rng);
  return Math.sqrt(-2 * Math.log(u1)) * Math.cos(2 * Math.PI * u2);
}

/** 1.96: the 97.5th percentile of the standard normal (a 95% interval is ±1.96 sd). */
export const Z_975 = 1.96;

/**
 * Spread of a value's distribution below and above it (standard deviations), from its
 * published uncertainty, or null when it is held fixed:
 * - percent, basis two-sd (source: "±2 SD as % of the mean"): sd = value x p/100 / 2.
 * - percent, basis ci95 (95% interval half-width): sd = value x p/100 / 1.96.
 * - range low..high read as a 95% interval: a two-piece normal with the mode at the value,
 *   sd below = (value - low)/1.96, sd above = (high - value)/1.96 (keeps asymmetric ranges).
 * - none, plus-minus: fixed.
 */
export function spreadOf(value: number, u: Uncertainty): { below: number; above: number } | null {
  switch (u.kind) {
    case 'percent': {
      const sd = (value * u.plusMinusPercent) / 100 / (u.basis === 'two-sd' ? 2 : Z_975);
      return sd > 0 ? { below: sd, above: sd } : null;
    }
    case 'range': {
      const below = Math.max(0, value - u.low) / Z_975;
      const above = Math.max(0, u.high - value) / Z_975;
      return below + above > 0 ? { below, above } : null;
    }
    default:
      return null;
  }
}

/**
 * One draw from a (two-piece) normal centred on `value`, truncated at zero by rejection
 * (IPCC Approach 2 over non-negative factors, as issue 3 asks).
 */
export function drawTruncated(rng: RandomGenerator, value: number, spread: { below: number; above: number }): number {
  const pBelow = spread.below / (spread.below + spread.above);
  for (let attempt = 0; attempt < 10_000; attempt++) {
    const lower = uniformFloat64(rng) < pBelow;
    const z = Math.abs(standardNormal(rng));
    const x = lower ? value - z * spread.below : value + z * spread.above;
    if (x >= 0) return x;
  }
  throw new Error(`truncated normal around ${value} rejected 10000 draws`);
}

/** Percentile p in [0, 1] of sorted values, linear interpolation between order statistics. */
export function percentile(sorted: readonly number[], p: number): number {
  if (sorted.length === 0) throw new Error('percentile of no values');
  const h = (sorted.length - 1) * p;
  const lo = Math.floor(h);
  const hi = Math.min(lo + 1, sorted.length - 1);
  return sorted[lo]! + (h - lo) * (sorted[hi]! - sorted[lo]!);
}
