import { describe, expect, it } from 'vitest';
import {
  EstimateInputError,
  IPCC_2006,
  IPCC_2019,
  estimateLandUseChange,
  estimateRequestSchema,
  type EstimateRequest,
  type FactorSetDocument,
} from '~/lib/carbon';

// Every refusal of issue 3 (422 at the API), each naming the field.
const ok = {
  factorSet: 'ipcc-2006',
  climate: 'cool-temperate-moist',
  soils: [{ type: 'hac', fraction: 1 }],
  areaHa: 10,
  before: { landUse: 'grassland', management: 'nominal', input: 'medium' },
  after: { landUse: 'cropland', system: 'long-term-cultivated', tillage: 'full', input: 'medium' },
};
const paths = (body: object) => {
  const r = estimateRequestSchema.safeParse(body);
  expect(r.success).toBe(false);
  return r.success ? [] : r.error.issues.map((i) => i.path.join('.'));
};
const refusal = (body: object, set: FactorSetDocument = IPCC_2006) => {
  try {
    estimateLandUseChange(estimateRequestSchema.parse(body), set);
  } catch (e) {
    expect(e).toBeInstanceOf(EstimateInputError);
    return (e as EstimateInputError).issues;
  }
  throw new Error('expected an EstimateInputError');
};

describe('request schema (shape)', () => {
  it('accepts the issue 3 example and fills the defaults', () => {
    const r = estimateRequestSchema.parse(ok);
    expect(r).toMatchObject({ transitionYears: 20, gwp: 'ar5', biomass: true, n2o: true });
    expect(r.uncertainty).toBeUndefined();
  });
  it('unknown climate region', () => expect(paths({ ...ok, climate: 'mediterranean' })).toEqual(['climate']));
  it('unknown soil class', () =>
    expect(paths({ ...ok, soils: [{ type: 'loam', fraction: 1 }] })).toEqual(['soils.0.type']));
  it('fractions that do not sum to 1 (beyond 1e-6), on ["soils"]', () => {
    expect(
      paths({
        ...ok,
        soils: [
          { type: 'hac', fraction: 0.6 },
          { type: 'lac', fraction: 0.3 },
        ],
      }),
    ).toEqual(['soils']);
    expect(
      estimateRequestSchema.safeParse({
        ...ok,
        soils: [
          { type: 'hac', fraction: 0.7 },
          { type: 'lac', fraction: 0.3 + 5e-7 },
        ],
      }).success,
    ).toBe(true);
    expect(
      paths({
        ...ok,
        soils: [
          { type: 'hac', fraction: 0.7 },
          { type: 'lac', fraction: 0.3 + 2e-6 },
        ],
      }),
    ).toEqual(['soils']);
  });
  it('a soil class listed twice', () =>
    expect(
      paths({
        ...ok,
        soils: [
          { type: 'hac', fraction: 0.5 },
          { type: 'hac', fraction: 0.5 },
        ],
      }),
    ).toEqual(['soils.1.type']));
  it('negative or zero area, on ["areaHa"]', () => {
    expect(paths({ ...ok, areaHa: -3 })).toEqual(['areaHa']);
    expect(paths({ ...ok, areaHa: 0 })).toEqual(['areaHa']);
  });
  it('non-finite numbers are rejected', () =>
    expect(paths({ ...ok, areaHa: Number.POSITIVE_INFINITY })).toEqual(['areaHa']));
  it('high input on non-improved grassland, before or after', () => {
    expect(paths({ ...ok, before: { landUse: 'grassland', management: 'nominal', input: 'high' } })).toEqual([
      'before.input',
    ]);
    expect(paths({ ...ok, after: { landUse: 'grassland', management: 'severely-degraded', input: 'high' } })).toEqual([
      'after.input',
    ]);
    expect(
      estimateRequestSchema.safeParse({ ...ok, after: { landUse: 'grassland', management: 'improved', input: 'high' } })
        .success,
    ).toBe(true);
  });
  it('unknown management, tillage, input or gwp; too many runs', () => {
    expect(paths({ ...ok, after: { ...ok.after, tillage: 'ridge' } })).toEqual(['after.tillage']);
    expect(paths({ ...ok, gwp: 'ar3' })).toEqual(['gwp']);
    expect(paths({ ...ok, uncertainty: { runs: 20001, seed: 1 } })).toEqual(['uncertainty.runs']);
    expect(paths({ ...ok, uncertainty: { runs: 1000, seed: 1.5 } })).toEqual(['uncertainty.seed']);
  });
});

describe('combinations the tables mark not applicable (EstimateInputError)', () => {
  it('a soil class with no reference stock in the region (spodic, tropical moist; 2006 Table 2.3 NA)', () => {
    const issues = refusal({
      ...ok,
      climate: 'tropical-moist',
      soils: [
        { type: 'hac', fraction: 0.5 },
        { type: 'spodic', fraction: 0.5 },
      ],
    });
    expect(issues).toHaveLength(1);
    expect(issues[0]!.path).toEqual(['soils', 1, 'type']);
    expect(issues[0]!.message).toMatch(/spodic.*SOC_REF.*tropical-moist/);
  });
  it('LAC in boreal climates', () =>
    expect(refusal({ ...ok, climate: 'boreal-dry', soils: [{ type: 'lac', fraction: 1 }] })[0]!.path).toEqual([
      'soils',
      0,
      'type',
    ]));
  it('polar regions: no row in Tables 2.3 / 5.5 / 6.2, every problem listed', () => {
    const issues = refusal({ ...ok, climate: 'polar-moist' });
    expect(issues.map((i) => i.path.join('.'))).toEqual(
      expect.arrayContaining(['soils.0.type', 'after.system', 'before.management']),
    );
  });
  it('organic soil in a polar region', () => {
    expect(
      refusal({ ...ok, climate: 'polar-dry', soils: [{ type: 'organic', fraction: 1 }] }).map((i) => i.path.join('.')),
    ).toContain('soils.0.type');
  });
  it('biomass with no Table 6.4 row (tropical montane) names the biomass switch', () => {
    const issues = refusal({ ...ok, climate: 'tropical-montane' });
    expect(issues[0]!.path).toEqual(['biomass']);
    expect(issues[0]!.message).toMatch(/set biomass to false/);
    expect(() =>
      estimateLandUseChange(
        estimateRequestSchema.parse({ ...ok, climate: 'tropical-montane', biomass: false }),
        IPCC_2006,
      ),
    ).not.toThrow();
  });
  it('perennial cropland biomass in a boreal climate (Table 5.9 NA)', () => {
    const issues = refusal({ ...ok, climate: 'boreal-moist', after: { ...ok.after, system: 'perennial' } });
    expect(issues.map((i) => i.path.join('.'))).toEqual(['biomass']);
  });
  it('a request naming one set run against another (sets are never mixed)', () => {
    expect(refusal({ ...ok, factorSet: 'ipcc-2006' }, IPCC_2019)[0]!.path).toEqual(['factorSet']);
  });
  it('a set lacking a value', () => {
    const broken: FactorSetDocument = {
      ...IPCC_2006,
      id: 'broken',
      tables: IPCC_2006.tables.filter((t) => t.key !== 'gwp'),
    };
    const issues = refusal({ ...ok, factorSet: 'broken' }, broken);
    expect(issues[0]).toMatchObject({ path: ['factorSet'] });
    expect(issues[0]!.message).toMatch(/gwp/);
  });
  it('an unparsed request passed straight to the engine is refused, not computed', () => {
    const bad = { ...estimateRequestSchema.parse(ok), areaHa: -1 } as EstimateRequest;
    expect(() => estimateLandUseChange(bad, IPCC_2006)).toThrow(EstimateInputError);
  });
});
