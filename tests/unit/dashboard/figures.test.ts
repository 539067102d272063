/**
 * The dashboard's pure figures. Source of the ratio rule: Reg. (EU) 2021/2115 Annex III, GAEC 1 —
 * the ratio of permanent grassland to agricultural area may not fall by more than 5 % against the
 * reference year (recalled from memory). The headroom is checked against the shipped rule set's own
 * evaluator: converting exactly the headroom must not fire the ratio rule, a little more must.
 */
import { describe, expect, it } from 'vitest';
import {
  budgetLeft,
  changesByYear,
  classifyChange,
  conditionsByDue,
  conversionPending,
  daysPast,
  regionHeadroom,
} from '~/lib/dashboard/figures';
import { gradeProposal, TARROW_SCREENING } from '~/lib/rules';
import { regionFacts } from '~/lib/rules/region-facts';
import { facts } from '../rules/facts-builder';

const REF = { id: 'tarrow-screening', version: 1 };
const fires = (
  figures: { agriculturalHa: number; permanentGrasslandHa: number },
  reference: number,
  convertedHa: number,
) =>
  gradeProposal(
    facts({
      regions: [
        regionFacts({ key: 'r', label: 'R', ...figures }, { ratio: reference, referenceYear: 2018 }, convertedHa),
      ],
    }),
    TARROW_SCREENING,
    REF,
  ).reasons.some((r) => r.rule === 'region-ratio-fall');

describe('regionHeadroom (GAEC 1, at most 5 % relative fall, from memory)', () => {
  it('worked example: reference 0.80, 1,000 ha farmed, 790 ha permanent grass, 10 ha approved but not yet recorded', () => {
    // Limit ratio 0.80 × 0.95 = 0.76 → 760 ha must stay; 790 − 10 − 760 = 20 ha left (arithmetic by hand).
    const h = regionHeadroom({
      agriculturalHa: 1000,
      permanentGrasslandHa: 790,
      referenceRatio: 0.8,
      maxRelativeFall: 0.05,
      pendingConvertedHa: 10,
    });
    expect(h.limitRatio).toBeCloseTo(0.76, 12);
    expect(h.ratioNow).toBeCloseTo(0.79, 12);
    expect(h.ratioAfterPending).toBeCloseTo(0.78, 12);
    expect(h.headroomHa).toBeCloseTo(20, 9);
    expect(h.shortfallHa).toBe(0);
  });

  it('agrees with the rule evaluator: the headroom is allowed, 0.01 ha more is barred', () => {
    const fig = { agriculturalHa: 2345.6, permanentGrasslandHa: 1801.2 };
    const h = regionHeadroom({ ...fig, referenceRatio: 0.79, maxRelativeFall: 0.05, pendingConvertedHa: 0 });
    expect(h.headroomHa!).toBeGreaterThan(0);
    expect(fires(fig, 0.79, h.headroomHa!)).toBe(false);
    expect(fires(fig, 0.79, h.headroomHa! + 0.01)).toBe(true);
  });

  it('a region already past the limit has no headroom and says by how much', () => {
    // 700 − 20 = 680 ha against 760 ha needed: 80 ha short.
    const h = regionHeadroom({
      agriculturalHa: 1000,
      permanentGrasslandHa: 700,
      referenceRatio: 0.8,
      maxRelativeFall: 0.05,
      pendingConvertedHa: 20,
    });
    expect(h.headroomHa).toBe(0);
    expect(h.shortfallHa).toBeCloseTo(80, 9);
  });

  it('is undecided (null), never guessed, without a reference ratio, a ratio rule or farmed area', () => {
    expect(
      regionHeadroom({
        agriculturalHa: 1000,
        permanentGrasslandHa: 700,
        referenceRatio: null,
        maxRelativeFall: 0.05,
        pendingConvertedHa: 0,
      }).headroomHa,
    ).toBeNull();
    expect(
      regionHeadroom({
        agriculturalHa: 1000,
        permanentGrasslandHa: 700,
        referenceRatio: 0.8,
        maxRelativeFall: null,
        pendingConvertedHa: 0,
      }).headroomHa,
    ).toBeNull();
    expect(
      regionHeadroom({
        agriculturalHa: 0,
        permanentGrasslandHa: 0,
        referenceRatio: 0.8,
        maxRelativeFall: 0.05,
        pendingConvertedHa: 0,
      }),
    ).toMatchObject({ ratioNow: null, headroomHa: null });
  });
});

describe('classifyChange and changesByYear', () => {
  it('grass to a tilled use is a conversion, tilled land to grass a restoration, grass kept as grass neither', () => {
    expect(classifyChange('grassland', 'cropland')).toBe('conversion');
    expect(classifyChange('Meadow', 'cropland')).toBe('conversion');
    expect(classifyChange(null, 'cropland')).toBe('conversion');
    expect(classifyChange('arable', 'grassland')).toBe('restoration');
    expect(classifyChange('grassland', 'grassland')).toBe('other');
    expect(classifyChange('arable', 'cropland')).toBe('other');
  });

  it('a conversion stays pending until the land-use record shows a non-grass use after the decision', () => {
    expect(conversionPending({ priorLandUse: 'grassland', proposedLandUse: 'cropland', laterLandUse: null })).toBe(
      true,
    );
    expect(
      conversionPending({ priorLandUse: 'grassland', proposedLandUse: 'cropland', laterLandUse: 'grassland' }),
    ).toBe(true);
    expect(conversionPending({ priorLandUse: 'grassland', proposedLandUse: 'cropland', laterLandUse: 'arable' })).toBe(
      false,
    );
    expect(conversionPending({ priorLandUse: 'arable', proposedLandUse: 'grassland', laterLandUse: null })).toBe(false);
  });

  it('sums hectares per year of decision and fills the years between with zeros', () => {
    const rows = changesByYear(
      [
        { year: 2021, priorLandUse: 'grassland', proposedLandUse: 'cropland', areaHa: 1.5 },
        { year: 2021, priorLandUse: 'pasture', proposedLandUse: 'cropland', areaHa: 2.25 },
        { year: 2023, priorLandUse: 'arable', proposedLandUse: 'grassland', areaHa: 4 },
        { year: 2023, priorLandUse: 'grassland', proposedLandUse: 'grassland', areaHa: 9 },
      ],
      2024,
    );
    expect(rows).toEqual([
      { year: 2021, convertedHa: 3.75, restoredHa: 0 },
      { year: 2022, convertedHa: 0, restoredHa: 0 },
      { year: 2023, convertedHa: 0, restoredHa: 4 },
      { year: 2024, convertedHa: 0, restoredHa: 0 },
    ]);
    expect(changesByYear([], 2026)).toEqual([]);
  });
});

describe('budgetLeft, conditionsByDue, daysPast', () => {
  it('budget minus committed; overspending shows as a negative remainder; no budget → null', () => {
    expect(budgetLeft(5000, 1250)).toEqual({ budgetT: 5000, committedT: 1250, leftT: 3750, usedShare: 0.25 });
    expect(budgetLeft(5000, 6000).leftT).toBe(-1000);
    expect(budgetLeft(null, 10)).toEqual({ budgetT: null, committedT: 10, leftT: null, usedShare: null });
  });

  it('a condition due today is open; one due yesterday is overdue', () => {
    const c = (seq: number, dueDate: string) => ({
      seq,
      reference: `P-${seq}`,
      text: 'Keep a margin.',
      dueDate,
      checkedBy: 'Field officer',
    });
    const { open, overdue } = conditionsByDue(
      [c(3, '2026-12-02'), c(1, '2026-12-01'), c(2, '2027-01-05')],
      '2026-12-02',
    );
    expect(open.map((x) => x.seq)).toEqual([3, 2]);
    expect(overdue.map((x) => x.seq)).toEqual([1]);
  });

  it('counts calendar days across a leap day (2024 is a leap year: common practice)', () => {
    expect(daysPast('2024-02-28', '2024-03-01')).toBe(2);
    expect(daysPast('2026-12-10', '2026-12-02')).toBe(-8);
  });
});
