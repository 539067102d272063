import { describe, expect, it } from 'vitest';
import { IPCC_2006, canSignOff, factorSetDocumentSchema, unconfirmedTables } from '~/lib/carbon';
import raw2006 from '~/lib/carbon/factor-sets/ipcc-2006.json';
import { NONE, REGIMES, SOILS, checker, pct, range } from './factor-check';

// Every shipped default of src/lib/carbon/factor-sets/ipcc-2006.json, checked against the
// published table it comes from, as transcribed in the team reference shared/reference/ipcc-tier1.md.
// None of the IPCC PDFs could be opened: unless a check says "read in S.." the value is
// FROM MEMORY (high confidence, [M-H]) and ships as "unconfirmed". Pages are not recorded
// in the reference ("page not recorded"), except Eq 2.25 on p. 2.30 (from memory).

const c = checker(IPCC_2006);
const G = '2006 IPCC Guidelines for National Greenhouse Gas Inventories';

describe('ipcc-2006 document', () => {
  it('is a valid factor-set document, id ipcc-2006 version 1', () => {
    expect(factorSetDocumentSchema.safeParse(raw2006).success).toBe(true);
    expect(IPCC_2006.id).toBe('ipcc-2006');
    expect(IPCC_2006.version).toBe(1);
  });

  it('only the GWP table is confirmed; the set cannot back a signed assessment yet', () => {
    expect(unconfirmedTables(IPCC_2006).sort()).toEqual([
      'carbon-fraction',
      'cropland-biomass',
      'cropland-stock-factors',
      'grassland-biomass',
      'grassland-stock-factors',
      'n2o-mineralisation',
      'organic-soil-ef',
      'soc-ref',
    ]);
    expect(canSignOff(IPCC_2006)).toBe(false);
    expect(canSignOff(IPCC_2006, ['gwp'])).toBe(true);
  });
});

describe('SOC_REF: 2006 Vol 4 Ch 2 Table 2.3, page not recorded; from memory [M-H], tropical montane row [M-L]; unconfirmed', () => {
  // t C/ha, 0-30 cm; null = NA in the table; error ±90% = 2 SD as % of mean (from memory).
  const T23: Record<string, (number | null)[]> = {
    //                      HAC  LAC   Sandy Spodic Volcanic Wetland
    boreal: [68, null, 10, 117, 20, 146],
    'cold-temperate-dry': [50, 33, 34, null, 20, 87],
    'cold-temperate-moist': [95, 85, 71, 115, 130, 87],
    'warm-temperate-dry': [38, 24, 19, null, 70, 88],
    'warm-temperate-moist': [88, 63, 34, null, 80, 88],
    'tropical-dry': [38, 35, 31, null, 50, 86],
    'tropical-moist': [65, 47, 39, null, 70, 86],
    'tropical-wet': [44, 60, 66, null, 130, 86],
    'tropical-montane': [88, 63, 34, null, 80, 86], // [M-L]: row may not exist in the PDF
    polar: [null, null, null, null, null, null], // no polar row in Table 2.3
  };
  it('every cell, with ±90% (2 SD) error and explicit NA cells', () => {
    for (const [row, cells] of Object.entries(T23))
      cells.forEach((v, i) => {
        const key = `${row}/${SOILS[i]}`;
        if (v === null) c.na('soc-ref', key);
        else c.value('soc-ref', key, v, 't C/ha', pct(90, 'two-sd'), 'unconfirmed');
      });
  });
  it('names the table and marks the montane row low-confidence', () => {
    const t = IPCC_2006.tables.find((x) => x.key === 'soc-ref')!;
    expect(t.source).toMatchObject({ document: G, table: 'Table 2.3', page: null });
    expect(
      t.entries
        .filter((e) => e.key.startsWith('tropical-montane/') && e.value !== null)
        .every((e) => e.marker === 'M-L'),
    ).toBe(true);
  });
});

describe('Cropland factors: 2006 Vol 4 Ch 5 Table 5.5, page not recorded; from memory [M-H]; unconfirmed', () => {
  // [factor, level, values by regime TB-dry, TB-moist, Trop-dry, Trop-moist/wet, Montane; error ±% (2 SD) or null = NA]
  const T55: [string, string, number[], number[] | null][] = [
    ['f-lu', 'long-term-cultivated', [0.8, 0.69, 0.58, 0.48, 0.64], [9, 12, 61, 46, 50]],
    ['f-lu', 'paddy-rice', [1.1, 1.1, 1.1, 1.1, 1.1], [90, 90, 90, 90, 90]],
    ['f-lu', 'perennial', [1.0, 1.0, 1.0, 1.0, 1.0], [50, 50, 50, 50, 50]],
    ['f-lu', 'set-aside', [0.93, 0.82, 0.93, 0.82, 0.88], [11, 17, 11, 17, 50]],
    ['f-mg', 'full', [1.0, 1.0, 1.0, 1.0, 1.0], null],
    ['f-mg', 'reduced', [1.02, 1.08, 1.09, 1.15, 1.09], [6, 5, 9, 8, 50]],
    ['f-mg', 'none', [1.1, 1.15, 1.17, 1.22, 1.16], [5, 4, 8, 7, 50]],
    ['f-i', 'low', [0.95, 0.92, 0.95, 0.92, 0.94], [13, 14, 13, 14, 50]],
    ['f-i', 'medium', [1.0, 1.0, 1.0, 1.0, 1.0], null],
    ['f-i', 'high-without-manure', [1.04, 1.11, 1.04, 1.11, 1.08], [13, 10, 13, 10, 50]],
    ['f-i', 'high-with-manure', [1.37, 1.44, 1.37, 1.44, 1.41], [12, 13, 12, 13, 50]],
  ];
  it('every factor and regime, with errors as ±2 SD % of mean; polar marked NA', () => {
    for (const [f, level, vals, errs] of T55) {
      REGIMES.forEach((g, i) =>
        c.value(
          'cropland-stock-factors',
          `${f}/${level}/${g}`,
          vals[i]!,
          'dimensionless',
          errs ? pct(errs[i]!, 'two-sd') : NONE,
          'unconfirmed',
        ),
      );
      c.na('cropland-stock-factors', `${f}/${level}/polar`);
    }
  });
  it('is the 2006 table, not the older GPG-LULUCF 2003 Table 3.3.4 (0.82/0.71/0.69/0.58, read in S5)', () => {
    const v = (k: string) =>
      IPCC_2006.tables.find((t) => t.key === 'cropland-stock-factors')!.entries.find((e) => e.key === k)!.value;
    expect([
      v('f-lu/long-term-cultivated/temperate-boreal-dry'),
      v('f-lu/long-term-cultivated/tropical-moist-wet'),
    ]).not.toEqual([0.82, 0.58]);
  });
});

describe('Grassland factors: 2006 Vol 4 Ch 6 Table 6.2, page not recorded; from memory [M-H] except nominal = 1 (read in S3, Ch 6 §6.3.3.1)', () => {
  const T62: [string, string, number[], number[] | null, 'confirmed' | 'unconfirmed'][] = [
    ['f-lu', 'all-permanent', [1, 1, 1, 1, 1], null, 'confirmed'],
    ['f-mg', 'nominal', [1, 1, 1, 1, 1], null, 'confirmed'],
    ['f-mg', 'moderately-degraded', [0.95, 0.95, 0.97, 0.97, 0.96], [13, 13, 11, 11, 40], 'unconfirmed'],
    ['f-mg', 'severely-degraded', [0.7, 0.7, 0.7, 0.7, 0.7], [40, 40, 40, 40, 40], 'unconfirmed'],
    ['f-mg', 'improved', [1.14, 1.14, 1.17, 1.17, 1.16], [11, 11, 9, 9, 40], 'unconfirmed'],
    ['f-i', 'medium', [1, 1, 1, 1, 1], null, 'confirmed'],
    ['f-i', 'high', [1.11, 1.11, 1.11, 1.11, 1.11], [7, 7, 7, 7, 7], 'unconfirmed'],
  ];
  it('every factor and regime (error basis not stated: read as 95% interval, common practice)', () => {
    for (const [f, level, vals, errs, status] of T62) {
      REGIMES.forEach((g, i) =>
        c.value(
          'grassland-stock-factors',
          `${f}/${level}/${g}`,
          vals[i]!,
          'dimensionless',
          errs ? pct(errs[i]!, 'ci95') : NONE,
          status,
        ),
      );
      c.na('grassland-stock-factors', `${f}/${level}/polar`);
    }
  });
});

describe('Grassland biomass: 2006 Vol 4 Ch 6 Table 6.4, page not recorded; from memory [M-H]; unconfirmed; ±75%', () => {
  const T64: [string, number, number][] = [
    ['boreal', 1.7, 8.5],
    ['cold-temperate-dry', 1.7, 6.5],
    ['cold-temperate-wet', 2.4, 13.6],
    ['warm-temperate-dry', 1.6, 6.1],
    ['warm-temperate-wet', 2.7, 13.5],
    ['tropical-dry', 2.3, 8.7],
    ['tropical-moist-wet', 6.2, 16.1],
  ];
  it('total (above + below, used) and peak above-ground (stored) for each row; montane and polar NA', () => {
    for (const [row, ag, total] of T64) {
      c.value('grassland-biomass', `total/${row}`, total, 't d.m./ha', pct(75, 'ci95'), 'unconfirmed');
      c.value('grassland-biomass', `above-ground/${row}`, ag, 't d.m./ha', pct(75, 'ci95'), 'unconfirmed');
    }
    for (const row of ['tropical-montane', 'polar'])
      for (const col of ['total', 'above-ground']) c.na('grassland-biomass', `${col}/${row}`);
  });
  it('flags the cold temperate wet cell that fails total = AG x (1 + R): 2.4 x 5 = 12.0, not 13.6', () => {
    const e = IPCC_2006.tables
      .find((t) => t.key === 'grassland-biomass')!
      .entries.find((x) => x.key === 'total/cold-temperate-wet')!;
    expect(e.note).toMatch(/12\.0/);
  });
});

describe('Carbon fraction 0.47: 2006 Vol 4 Ch 6 (same default as Ch 4 Table 4.3), page not recorded; from memory [M-H]; unconfirmed', () => {
  it('0.47 t C per t d.m., not the older 0.50; no range given (held fixed)', () => {
    c.value('carbon-fraction', 'herbaceous', 0.47, 't C/t d.m.', NONE, 'unconfirmed');
  });
});

describe('Cropland biomass: 2006 Vol 4 Ch 5 Table 5.9, page not recorded; from memory [M-H]; unconfirmed; ±75%', () => {
  it('annual 5.0 t C/ha; perennial temperate 63.0, tropical dry/moist/wet 9.0/21.0/50.0; other rows NA', () => {
    c.value('cropland-biomass', 'annual/all', 5.0, 't C/ha', pct(75, 'ci95'), 'unconfirmed');
    c.value('cropland-biomass', 'perennial/temperate', 63.0, 't C/ha', pct(75, 'ci95'), 'unconfirmed');
    c.value('cropland-biomass', 'perennial/tropical-dry', 9.0, 't C/ha', pct(75, 'ci95'), 'unconfirmed');
    c.value('cropland-biomass', 'perennial/tropical-moist', 21.0, 't C/ha', pct(75, 'ci95'), 'unconfirmed');
    c.value('cropland-biomass', 'perennial/tropical-wet', 50.0, 't C/ha', pct(75, 'ci95'), 'unconfirmed');
    for (const row of ['boreal', 'tropical-montane', 'polar']) c.na('cropland-biomass', `perennial/${row}`);
  });
});

describe(
  'Drained organic soils: 2006 Vol 4 Ch 5 Table 5.6 (cropland) and Ch 6 Table 6.3 (grassland), pages not ' +
    'recorded; from memory [M-H]; unconfirmed; ±90%',
  () => {
    it('t C/ha/yr by land use and climate; polar NA; each entry names its own table', () => {
      const u = pct(90, 'ci95');
      const crop = [
        ['boreal-cold-temperate', 5.0],
        ['warm-temperate', 10.0],
        ['tropical', 20.0],
      ] as const;
      const grass = [
        ['boreal-cold-temperate', 0.25],
        ['warm-temperate', 2.5],
        ['tropical', 5.0],
      ] as const;
      for (const [row, v] of crop)
        expect(c.value('organic-soil-ef', `cropland/${row}`, v, 't C/ha/yr', u, 'unconfirmed').source?.table).toBe(
          'Table 5.6',
        );
      for (const [row, v] of grass)
        expect(c.value('organic-soil-ef', `grassland/${row}`, v, 't C/ha/yr', u, 'unconfirmed').source?.table).toBe(
          'Table 6.3',
        );
      c.na('organic-soil-ef', 'cropland/polar');
      c.na('organic-soil-ef', 'grassland/polar');
    });
  },
);

describe('N2O from mineralisation: 2006 Vol 4 Ch 11 Eq 11.8, Tables 11.1 and 11.3, pages not recorded', () => {
  it('R = 15 (10-30) and 10 (8-15): read in S2 (R package docs quoting IPCC 2006) -> confirmed', () => {
    c.value('n2o-mineralisation', 'cn-ratio/land-use-change', 15, 't C/t N', range(10, 30), 'confirmed');
    c.value('n2o-mineralisation', 'cn-ratio/cropland-management', 10, 't C/t N', range(8, 15), 'confirmed');
  });
  it(
    'EF1 0.01 (0.003-0.03) and EF1_FR 0.003 (0-0.006), Table 11.1; Frac_LEACH 0.30 (0.1-0.8), EF5 0.0075 ' +
      '(0.0005-0.025), Table 11.3: from memory [M-H]',
    () => {
      c.value('n2o-mineralisation', 'ef1/wet', 0.01, 'kg N2O-N/kg N', range(0.003, 0.03), 'unconfirmed');
      c.value('n2o-mineralisation', 'ef1/dry', 0.01, 'kg N2O-N/kg N', range(0.003, 0.03), 'unconfirmed');
      c.value('n2o-mineralisation', 'ef1/flooded-rice', 0.003, 'kg N2O-N/kg N', range(0, 0.006), 'unconfirmed');
      c.value('n2o-mineralisation', 'frac-leach', 0.3, 'kg N/kg N added', range(0.1, 0.8), 'unconfirmed');
      c.value('n2o-mineralisation', 'ef5', 0.0075, 'kg N2O-N/kg N leached', range(0.0005, 0.025), 'unconfirmed');
    },
  );
});

describe(
  'GWP-100: AR4 WG1 Table 2.14, AR5 WG1 Table 8.7/8.A.1, AR6 WG1 Table 7.15 (pages not recorded); ' +
    'cross-checked in S6 [X], AR6 CH4 read in S9 [V] -> confirmed',
  () => {
    it('AR4 25/298, AR5 (no feedback) 28/265, AR6 CH4 non-fossil 27.0 / fossil 29.8 (±11), N2O 273 (±130)', () => {
      c.value('gwp', 'ar4/ch4', 25, 't CO2e/t CH4', NONE, 'confirmed');
      c.value('gwp', 'ar4/n2o', 298, 't CO2e/t N2O', NONE, 'confirmed');
      c.value('gwp', 'ar5/ch4', 28, 't CO2e/t CH4', NONE, 'confirmed');
      c.value('gwp', 'ar5/n2o', 265, 't CO2e/t N2O', NONE, 'confirmed');
      c.value(
        'gwp',
        'ar6/ch4-non-fossil',
        27.0,
        't CO2e/t CH4',
        { kind: 'plus-minus', plusMinus: 11, basis: 'unstated' },
        'confirmed',
      );
      c.value(
        'gwp',
        'ar6/ch4-fossil',
        29.8,
        't CO2e/t CH4',
        { kind: 'plus-minus', plusMinus: 11, basis: 'unstated' },
        'confirmed',
      );
      c.value(
        'gwp',
        'ar6/n2o',
        273,
        't CO2e/t N2O',
        { kind: 'plus-minus', plusMinus: 130, basis: 'unstated' },
        'confirmed',
      );
    });
  },
);

describe('coverage', () => {
  it('every entry shipped in ipcc-2006.json was checked above', () => {
    expect(c.allKeys().filter((k) => !c.checked.has(k))).toEqual([]);
    expect(c.checked.size).toBe(c.allKeys().length);
  });
});
