/**
 * Grouped Monte Carlo against per-parcel runs: parcels that share a climate region and a pair of
 * states differ only in area and soil mix, so the joint runs of their merged request (one area-weighted
 * request per kind, mergeLinearRequests + runJointMonteCarlo, what an assessment runs) must equal, run by
 * run, the sum of every parcel computed on its own with the same draws (jointSamplesPerItem). The method is
 * IPCC Approach 2 (2006 IPCC Guidelines Vol 1 Ch 3, from memory); that Tier 1 figures are linear in area for
 * fixed factor values is common practice (stock change = area x SOC_REF x factor difference).
 */
import { describe, expect, it } from 'vitest';
import {
  buildPlan,
  estimateLandUseChange,
  estimateRequestSchema,
  IPCC_2006,
  jointSamplesPerItem,
  mergeLinearRequests,
  runJointMonteCarlo,
  type EstimateRequest,
} from '~/lib/carbon';
import { percentile } from '~/lib/carbon/sampling';
import { jointTotal } from '~/lib/proposals/assessment-figures';

const grass = { landUse: 'grassland', management: 'nominal', input: 'medium' } as const;
const improved = { landUse: 'grassland', management: 'improved', input: 'medium' } as const;
const crop = { landUse: 'cropland', system: 'long-term-cultivated', tillage: 'full', input: 'medium' } as const;
const req = (soils: { type: string; fraction: number }[], areaHa: number, before: object = grass) =>
  estimateRequestSchema.parse({
    factorSet: 'ipcc-2006',
    climate: 'cool-temperate-moist',
    soils,
    areaHa,
    before,
    after: crop,
    transitionYears: 20,
    gwp: 'ar5',
    biomass: true,
    n2o: true,
  });

// The first parcel of each kind names every soil class of that kind in sorted order, so the factors
// are met in the same order either way and the seeded generator gives them the same draws.
const PARCELS: EstimateRequest[] = [
  req(
    [
      { type: 'hac', fraction: 0.6 },
      { type: 'spodic', fraction: 0.4 },
    ],
    3.2,
  ),
  req([{ type: 'hac', fraction: 1 }], 7.5),
  req([{ type: 'spodic', fraction: 1 }], 0.8),
  req(
    [
      { type: 'hac', fraction: 0.25 },
      { type: 'spodic', fraction: 0.75 },
    ],
    12.25,
  ),
  req([{ type: 'hac', fraction: 1 }], 4, improved),
  req([{ type: 'hac', fraction: 1 }], 1.5, improved),
];
const RUNS = 500;
const SEED = 42;

describe('grouped Monte Carlo (parcels of one kind share one set of runs)', () => {
  it('merges six parcels into two requests, one per kind of change', () => {
    const merged = mergeLinearRequests(PARCELS);
    expect(merged).toHaveLength(2);
    expect(merged[0]!.areaHa).toBeCloseTo(3.2 + 7.5 + 0.8 + 12.25, 12);
    // Area-weighted soil shares: hac = (0.6*3.2 + 7.5 + 0.25*12.25) / 23.75 (arithmetic, common practice).
    expect(merged[0]!.soils.find((s) => s.type === 'hac')!.fraction).toBeCloseTo(
      (0.6 * 3.2 + 7.5 + 0.25 * 12.25) / 23.75,
      12,
    );
  });

  it('gives, run by run, the sum of the parcels computed one by one with the same seed', () => {
    const merged = mergeLinearRequests(PARCELS);
    const grouped = jointSamplesPerItem(
      merged.map((r) => ({ plan: buildPlan(r, IPCC_2006), areaHa: r.areaHa })),
      20,
      RUNS,
      SEED,
    );
    const single = jointSamplesPerItem(
      PARCELS.map((r) => ({ plan: buildPlan(r, IPCC_2006), areaHa: r.areaHa })),
      20,
      RUNS,
      SEED,
    );
    for (let i = 0; i < RUNS; i++) {
      const a = grouped.reduce((s, x) => s + x[i]!, 0);
      const b = single.reduce((s, x) => s + x[i]!, 0);
      expect(Math.abs(a - b)).toBeLessThanOrEqual(1e-9 * Math.abs(b));
    }
  });

  it('gives the same total and 95 % range as the per-parcel runs', () => {
    const g = jointTotal(PARCELS, IPCC_2006, RUNS, SEED);
    const single = jointSamplesPerItem(
      PARCELS.map((r) => ({ plan: buildPlan(r, IPCC_2006), areaHa: r.areaHa })),
      20,
      RUNS,
      SEED,
    );
    const totals = Array.from({ length: RUNS }, (_, i) => single.reduce((s, x) => s + x[i]!, 0)).sort((a, b) => a - b);
    const point = PARCELS.reduce((s, r) => s + estimateLandUseChange(r, IPCC_2006).co2eTotal, 0);
    expect(g.co2eTotal).toBeCloseTo(point, 8);
    expect(g.co2eLow).toBeCloseTo(percentile(totals, 0.025), 8);
    expect(g.co2eHigh).toBeCloseTo(percentile(totals, 0.975), 8);
    const direct = runJointMonteCarlo(
      PARCELS.map((r) => ({ plan: buildPlan(r, IPCC_2006), areaHa: r.areaHa })),
      20,
      RUNS,
      SEED,
    );
    expect(g.co2eLow).toBeCloseTo(direct.co2eLow, 8);
    expect(g.co2eHigh).toBeCloseTo(direct.co2eHigh, 8);
    // A different seed moves the range: the comparison is not between two constants.
    expect(jointTotal(PARCELS, IPCC_2006, RUNS, SEED + 1).co2eHigh).not.toBeCloseTo(g.co2eHigh, 6);
  });
});
