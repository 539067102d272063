/**
 * A batch of estimates (estimateBatch: one parse and one plan per kind of request, shared factor and
 * caution lists) against the plain path, estimateLandUseChange for each request on its own: the same
 * results, to the last bit, and the same refusal of a bad request. The method is the IPCC Tier 1
 * stock-change method (2006 IPCC Guidelines Vol 4 Ch 2, from memory); the checks compare the two paths only.
 */
import { describe, expect, it } from 'vitest';
import {
  estimateBatch,
  estimateLandUseChange,
  EstimateInputError,
  IPCC_2006,
  type EstimateRequest,
} from '~/lib/carbon';

const grass = { landUse: 'grassland', management: 'nominal', input: 'medium' } as const;
const improved = { landUse: 'grassland', management: 'improved', input: 'high' } as const;
const crop = { landUse: 'cropland', system: 'long-term-cultivated', tillage: 'full', input: 'medium' } as const;
const base = { factorSet: 'ipcc-2006', climate: 'cool-temperate-moist', transitionYears: 20, gwp: 'ar5' } as const;

const requests = [
  { ...base, soils: [{ type: 'hac', fraction: 1 }], areaHa: 3.2, before: grass, after: crop },
  { ...base, soils: [{ type: 'hac', fraction: 1 }], areaHa: 0.15, before: grass, after: crop },
  { ...base, soils: [{ type: 'hac', fraction: 1 }], areaHa: 7, before: improved, after: crop },
  {
    ...base,
    soils: [
      { type: 'hac', fraction: 0.4 },
      { type: 'spodic', fraction: 0.6 },
    ],
    areaHa: 2,
    before: grass,
    after: crop,
  },
  {
    ...base,
    soils: [
      { type: 'hac', fraction: 0.25 },
      { type: 'spodic', fraction: 0.75 },
    ],
    areaHa: 2,
    before: grass,
    after: crop,
  },
  {
    ...base,
    soils: [
      { type: 'hac', fraction: 0.7 },
      { type: 'organic', fraction: 0.3 },
    ],
    areaHa: 1.1,
    before: grass,
    after: crop,
  },
  // Defaults left out: parsed on its own, the same figures as the request that spells them.
  { climate: 'cool-temperate-moist', soils: [{ type: 'hac', fraction: 1 }], areaHa: 3.2, before: grass, after: crop },
  {
    ...base,
    soils: [{ type: 'hac', fraction: 1 }],
    areaHa: 5,
    before: grass,
    after: crop,
    uncertainty: { runs: 200, seed: 4 },
  },
  { ...base, soils: [{ type: 'hac', fraction: 1 }], areaHa: 12.5, before: grass, after: crop },
] as EstimateRequest[];

describe('estimateBatch against each estimate on its own', () => {
  it('gives the same results, to the last bit', () => {
    const batch = estimateBatch(requests, IPCC_2006);
    batch.forEach((r, i) => {
      const single = estimateLandUseChange(requests[i]!, IPCC_2006);
      expect(r).toEqual(single);
      expect(JSON.stringify(r)).toBe(JSON.stringify(single));
    });
    // Kinds that differ only in their soil fractions share equal factor lists.
    expect(batch[3]!.factors).toBe(batch[4]!.factors);
    expect(batch[0]!.factors).toBe(batch[1]!.factors);
  });

  it('refuses a bad area in a batch as the single estimate does, after a good request of its kind', () => {
    for (const areaHa of [0, -2, Number.NaN, Number.POSITIVE_INFINITY]) {
      const bad = { ...requests[0]!, areaHa };
      let single: unknown;
      try {
        estimateLandUseChange(bad, IPCC_2006);
      } catch (e) {
        single = e;
      }
      expect(single).toBeInstanceOf(EstimateInputError);
      expect(() => estimateBatch([requests[0]!, bad], IPCC_2006)).toThrow((single as Error).message);
    }
  });
});
