/**
 * A region's ratio before and after a proposal, hand-computed. The ratio is permanent grassland
 * over agricultural area and the limit a fall of more than 5 % (relative) against the reference
 * (Reg. (EU) 2021/2115 Annex III GAEC 1; recalled from memory, per the issue text).
 */
import { describe, expect, it } from 'vitest';
import { gradeProposal, regionFacts, TARROW_SCREENING } from '~/lib/rules';
import { facts } from './facts-builder';

const fig = { key: 'skarrow', label: 'Skarrow district', agriculturalHa: 400, permanentGrasslandHa: 240 };

describe('regionFacts', () => {
  it('converting 13 ha of 240 ha permanent grassland in 400 ha: 0.6 → 0.5675, 5.42 % below a 0.6 reference', () => {
    const r = regionFacts(fig, { ratio: 0.6, referenceYear: 2018 }, 13);
    expect(r.ratioNow).toBeCloseTo(0.6, 12); // 240 / 400
    expect(r.ratioAfter).toBeCloseTo(0.5675, 12); // 227 / 400
    expect(r.relativeFallAfter).toBeCloseTo(0.0541667, 6); // (0.6 - 0.5675) / 0.6
    const g = gradeProposal(facts({ regions: [r] }), TARROW_SCREENING, { id: 'tarrow-screening', version: 1 });
    expect(g.level).toBe(4);
    expect(g.reasons[0]!.text).toMatch(/Skarrow district.*0\.568.*13 ha.*5\.4 %.*0\.6 of 2018/);
  });

  it('exactly 12 ha converted is exactly 5 %: not past the limit', () => {
    const r = regionFacts(fig, { ratio: 0.6, referenceYear: 2018 }, 12); // 228 / 400 = 0.57; (0.6 - 0.57) / 0.6 = 5 %
    expect(r.relativeFallAfter).toBeCloseTo(0.05, 12);
    expect(gradeProposal(facts({ regions: [r] }), TARROW_SCREENING, { id: 'tarrow-screening', version: 1 }).level).toBe(
      1,
    );
  });

  it('area leaving agriculture shrinks the denominator; no reference gives no fall', () => {
    const r = regionFacts(fig, null, 10, 10);
    expect(r.ratioAfter).toBeCloseTo(230 / 390, 12);
    expect(r.relativeFallAfter).toBeNull();
    expect(regionFacts({ ...fig, agriculturalHa: 0, permanentGrasslandHa: 0 }, null, 0).ratioNow).toBeNull();
  });
});
