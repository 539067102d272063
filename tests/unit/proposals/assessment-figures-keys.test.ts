/**
 * An assessment names each parcel's group once and reuses the names for every alternative
 * (assessmentFigures → jointTotal with keys). The plain path merges every alternative's requests
 * afresh (jointTotal without keys); both must give the same figures to the last bit, as the same
 * sums are taken in the same order. That Tier 1 figures are linear in area for fixed factor values
 * is common practice (stock change = area x SOC_REF x factor difference).
 */
import { describe, expect, it } from 'vitest';
import { IPCC_2006 } from '~/lib/carbon';
import { alternativeSpecs } from '~/lib/proposals/alternatives';
import { assessmentFigures, jointTotal, type ParcelRequest } from '~/lib/proposals/assessment-figures';

const crop = { landUse: 'cropland', system: 'long-term-cultivated', tillage: 'full', input: 'medium' } as const;
const request = (i: number): ParcelRequest =>
  ({
    factorSet: IPCC_2006.id,
    factorSetVersion: IPCC_2006.version,
    climate: i % 4 === 3 ? 'warm-temperate-moist' : 'cool-temperate-moist',
    soils:
      i % 3 || i % 4 === 3
        ? [{ type: 'hac', fraction: 1 }]
        : [
            { type: 'lac', fraction: 0.3 },
            { type: 'spodic', fraction: 0.7 },
          ],
    areaHa: 0.7 + i / 9,
    before:
      i % 2
        ? { landUse: 'grassland', management: 'nominal', input: 'medium' }
        : { landUse: 'grassland', management: 'improved', input: i % 5 ? 'medium' : 'high' },
    after: crop,
    transitionYears: 20,
    gwp: 'ar5',
    biomass: true,
    n2o: true,
  }) as ParcelRequest;

describe('alternatives with the groups named once', () => {
  it('equal the plain merge of each alternative, to the last bit', () => {
    const requests = Array.from({ length: 37 }, (_, i) => ({ parcelId: i, areaHa: 0.7 + i / 9, request: request(i) }));
    const compensation = {
      ...request(2),
      before: crop,
      after: { landUse: 'grassland', management: 'nominal', input: 'medium' },
    };
    const input = {
      requests,
      proposed: crop,
      sharePercent: 40,
      runs: 300,
      seed: 5,
      compensation: { request: compensation as ParcelRequest, note: null },
    };
    const figures = assessmentFigures(input, IPCC_2006);
    const ok = requests.map((r) => r.request);
    const specs = alternativeSpecs(crop, 40).filter((s) => !s.unavailable);
    expect(specs.length).toBeGreaterThan(3);
    for (const { spec } of specs) {
      const reqs = ok.map((r) => ({
        ...r,
        after: spec.after ? spec.after(r.after, r.before) : r.after,
        areaHa: r.areaHa * spec.areaShare,
      }));
      const plain = jointTotal(reqs, IPCC_2006, 300, 5);
      const got = figures.alternatives.find((a) => a.key === spec.key)!;
      expect([got.co2eTotal, got.co2eLow, got.co2eHigh]).toEqual([plain.co2eTotal, plain.co2eLow, plain.co2eHigh]);
    }
    const plain = jointTotal([...ok, compensation as ParcelRequest], IPCC_2006, 300, 5);
    const got = figures.alternatives.find((a) => a.key === 'compensation')!;
    expect([got.co2eTotal, got.co2eLow, got.co2eHigh]).toEqual([plain.co2eTotal, plain.co2eLow, plain.co2eHigh]);
    expect([figures.totals.co2eLow, figures.totals.co2eHigh]).toEqual([
      jointTotal(ok, IPCC_2006, 300, 5).co2eLow,
      jointTotal(ok, IPCC_2006, 300, 5).co2eHigh,
    ]);
  });
});
