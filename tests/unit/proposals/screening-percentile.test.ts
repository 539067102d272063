/** The screening map's percentile by selection equals the sorted-array percentile the Monte Carlo range uses. */
import { describe, expect, it } from 'vitest';
import { percentileInPlace } from '~/lib/proposals/screening';

/** Linear interpolation between order statistics (R type 7, common practice; what carbon/sampling.ts does). */
function sortedPercentile(values: number[], p: number): number {
  const s = [...values].sort((a, b) => a - b);
  const h = (s.length - 1) * p;
  const lo = Math.floor(h);
  return s[lo]! + (h - lo) * (s[Math.min(lo + 1, s.length - 1)]! - s[lo]!);
}

describe('percentileInPlace', () => {
  it('matches the sorted percentile on random, tied and tiny inputs', () => {
    let seed = 7;
    const rnd = () => (seed = (seed * 16807) % 2147483647) / 2147483647;
    for (const n of [1, 2, 3, 10, 999, 1000]) {
      for (const gen of [() => rnd() * 100 - 50, () => Math.floor(rnd() * 4)]) {
        const xs = Array.from({ length: n }, gen);
        for (const p of [0, 0.025, 0.5, 0.975, 1]) {
          expect(percentileInPlace(new Float64Array(n), Float64Array.from(xs), p)).toBeCloseTo(
            sortedPercentile(xs, p),
            12,
          );
        }
      }
    }
  });
});
