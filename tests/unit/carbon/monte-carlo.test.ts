import { describe, expect, it } from 'vitest';
import {
  IPCC_2006,
  IPCC_2019,
  buildPlan,
  estimateLandUseChange,
  estimateRequestSchema,
  runMonteCarlo,
} from '~/lib/carbon';
import { xoroshiro128plus } from 'pure-rand/generator/xoroshiro128plus';
import { drawTruncated, percentile, spreadOf } from '~/lib/carbon/sampling';

// IPCC Approach 2 (2006 IPCC Guidelines Vol 1 Ch 3, Monte Carlo simulation; from memory).
const base = {
  climate: 'cool-temperate-moist',
  soils: [{ type: 'hac', fraction: 1 }],
  areaHa: 10,
  before: { landUse: 'grassland', management: 'nominal', input: 'medium' },
  after: { landUse: 'cropland', system: 'long-term-cultivated', tillage: 'full', input: 'medium' },
} as const;
const req = (extra: object = {}) => estimateRequestSchema.parse({ ...base, ...extra });

describe('Monte Carlo uncertainty', () => {
  it('same seed gives the same range; another seed a different one', () => {
    const a = estimateLandUseChange(req({ uncertainty: { runs: 1000, seed: 7 } }), IPCC_2006).uncertainty!;
    const b = estimateLandUseChange(req({ uncertainty: { runs: 1000, seed: 7 } }), IPCC_2006).uncertainty!;
    const d = estimateLandUseChange(req({ uncertainty: { runs: 1000, seed: 8 } }), IPCC_2006).uncertainty!;
    expect(b).toEqual(a);
    expect(a).toMatchObject({ runs: 1000, seed: 7 });
    expect(d.co2eLow).not.toBe(a.co2eLow);
  });

  it('defaults to 1000 runs, seed 1, when asked with {}', () => {
    expect(estimateLandUseChange(req({ uncertainty: {} }), IPCC_2006).uncertainty).toMatchObject({
      runs: 1000,
      seed: 1,
    });
    expect(estimateLandUseChange(req(), IPCC_2006).uncertainty).toBeUndefined();
  });

  for (const [name, extra, set] of [
    ['loss, 2006', {}, IPCC_2006],
    [
      'loss with organic soil, 2006',
      {
        soils: [
          { type: 'hac', fraction: 0.5 },
          { type: 'organic', fraction: 0.5 },
        ],
      },
      IPCC_2006,
    ],
    [
      'gain, 2006',
      { before: base.after, after: { landUse: 'grassland', management: 'improved', input: 'high' } },
      IPCC_2006,
    ],
    ['loss, 2019', { climate: 'tropical-moist' }, IPCC_2019],
  ] as const) {
    it(`the 95% range contains the point estimate (${name})`, () => {
      const r = estimateLandUseChange(req({ ...extra, uncertainty: { runs: 2000, seed: 3 } }), set);
      expect(r.uncertainty!.co2eLow).toBeLessThan(r.co2eTotal);
      expect(r.uncertainty!.co2eHigh).toBeGreaterThan(r.co2eTotal);
    });
  }

  it('more runs narrow the sampling noise of the percentile estimates (seeds 1..20, 200 vs 5000 runs)', () => {
    const r = req();
    const plan = buildPlan(r, IPCC_2006);
    const sd = (xs: number[]) => {
      const m = xs.reduce((s, x) => s + x, 0) / xs.length;
      return Math.sqrt(xs.reduce((s, x) => s + (x - m) ** 2, 0) / (xs.length - 1));
    };
    const spreadAt = (runs: number) => {
      const mc = Array.from({ length: 20 }, (_, i) => runMonteCarlo(plan, r.areaHa, r.transitionYears, runs, i + 1));
      return { low: sd(mc.map((m) => m.co2eLow)), high: sd(mc.map((m) => m.co2eHigh)) };
    };
    const small = spreadAt(200);
    const large = spreadAt(5000);
    // Sampling noise of a percentile falls roughly as 1/sqrt(N): 25x the runs -> about 1/5 the spread.
    expect(large.low).toBeLessThan(small.low / 2);
    expect(large.high).toBeLessThan(small.high / 2);
  });

  it('draws respect truncation at zero and the published spread (SOC_REF ±90% = 2 SD)', () => {
    const r = req();
    const plan = buildPlan(r, IPCC_2006);
    const mc = runMonteCarlo(plan, r.areaHa, r.transitionYears, 5000, 11);
    expect(mc.samples).toHaveLength(5000);
    expect(mc.samples.every(Number.isFinite)).toBe(true);
    // sd of SOC_REF 95 with ±90% as 2 SD = 42.75; as a 95% CI half-width it would be 43.62.
    expect(spreadOf(95, { kind: 'percent', plusMinusPercent: 90, basis: 'two-sd' })).toEqual({
      below: 42.75,
      above: 42.75,
    });
    expect(spreadOf(95, { kind: 'percent', plusMinusPercent: 90, basis: 'ci95' })!.below).toBeCloseTo(43.622, 3);
    // Asymmetric range (EF1 0.01, 0.003-0.03): two-piece normal, 1.96 sd to each end.
    const ef1 = spreadOf(0.01, { kind: 'range', low: 0.003, high: 0.03, basis: 'ci95' })!;
    expect(ef1.below).toBeCloseTo(0.007 / 1.96, 15);
    expect(ef1.above).toBeCloseTo(0.02 / 1.96, 15);
    // Truncation: a wide spread around 1 (sd 1) never yields a negative draw, and about 1/6 of
    // the untruncated mass (P(z < -1) = 0.159) is rejected, so the mean moves above 1.
    const rng = xoroshiro128plus(42);
    const draws = Array.from({ length: 20000 }, () => drawTruncated(rng, 1, { below: 1, above: 1 }));
    expect(Math.min(...draws)).toBeGreaterThanOrEqual(0);
    expect(draws.reduce((a, b) => a + b, 0) / draws.length).toBeGreaterThan(1.2);
    expect(spreadOf(1, { kind: 'none', reason: 'Reference level' })).toBeNull();
  });

  it('percentile interpolates between order statistics', () => {
    expect(percentile([0, 10], 0.5)).toBe(5);
    expect(percentile([1, 2, 3, 4, 5], 0.025)).toBeCloseTo(1.1, 12);
    expect(percentile([1, 2, 3, 4, 5], 0.975)).toBeCloseTo(4.9, 12);
  });

  it('20000 runs are allowed and stay finite', () => {
    const u = estimateLandUseChange(req({ uncertainty: { runs: 20000, seed: 5 } }), IPCC_2006).uncertainty!;
    expect(Number.isFinite(u.co2eLow) && Number.isFinite(u.co2eHigh) && u.co2eLow < u.co2eHigh).toBe(true);
  });
});
