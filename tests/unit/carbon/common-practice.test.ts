import { describe, expect, it } from 'vitest';
import {
  CLIMATE_REGIONS,
  EstimateInputError,
  IPCC_2006,
  MINERAL_SOIL_TYPES,
  estimateLandUseChange,
  estimateRequestSchema,
} from '~/lib/carbon';

// Common practice, no source: converting nominally managed grassland to long-term cultivated
// cropland (full tillage, medium input) never loses more than about half of the 0-30 cm soil
// carbon under any ipcc-2006 default; the worst case, tropical moist/wet, loses 52%
// (1 - F_LU 0.48 of 2006 Vol 4 Ch 5 Table 5.5, from memory).
describe('grassland to cultivated cropland loses at most ~52% of topsoil carbon (common practice)', () => {
  const losses: { climate: string; soil: string; loss: number }[] = [];
  for (const climate of CLIMATE_REGIONS)
    for (const soil of MINERAL_SOIL_TYPES) {
      const req = estimateRequestSchema.parse({
        climate,
        soils: [{ type: soil, fraction: 1 }],
        areaHa: 1,
        biomass: false,
        n2o: false,
        before: { landUse: 'grassland', management: 'nominal', input: 'medium' },
        after: { landUse: 'cropland', system: 'long-term-cultivated', tillage: 'full', input: 'medium' },
      });
      try {
        const r = estimateLandUseChange(req, IPCC_2006);
        losses.push({ climate, soil, loss: 1 - r.socAfterPerHa / r.socBeforePerHa });
      } catch (e) {
        if (!(e instanceof EstimateInputError)) throw e; // not-applicable combinations are refused, not estimated
      }
    }

  it('estimates every applicable region/soil pair (10 regions x 6 classes minus 7 NA cells)', () => {
    // 60 cells = 10 non-polar regions x 6; NA: boreal LAC (x2 regions), spodic in 7 regions -> 60 - 2 - 7 = 51 (polar refused)
    expect(losses).toHaveLength(51);
  });
  it('never loses more than 52%', () => {
    for (const l of losses) expect(l.loss, `${l.climate}/${l.soil}`).toBeLessThanOrEqual(0.52 + 1e-9);
  });
  it('the worst is tropical moist and wet at 52%; every pair loses something (20-52%)', () => {
    const worst = Math.max(...losses.map((l) => l.loss));
    expect(worst).toBeCloseTo(0.52, 9);
    expect(new Set(losses.filter((l) => Math.abs(l.loss - worst) < 1e-9).map((l) => l.climate))).toEqual(
      new Set(['tropical-moist', 'tropical-wet']),
    );
    expect(Math.min(...losses.map((l) => l.loss))).toBeCloseTo(0.2, 9);
  });
});
