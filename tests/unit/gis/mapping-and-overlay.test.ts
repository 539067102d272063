import { describe, expect, it } from 'vitest';
import { mapParcelFeature, mapReferenceFeature, parcelMappingSchema, readDate } from '~/lib/gis/field-mapping';
import { summariseKind } from '~/lib/gis/overlay-summary';
import { legendFor } from '~/lib/gis/reference-kinds';
import { readGisSettings } from '~/lib/gis/settings';

describe('column mapping', () => {
  const m = parcelMappingSchema.parse({ reference: 'ref', landUse: 'use', lastTillage: 'till', statedArea: 'area', statedAreaUnit: 'acres' });

  it('reads values through the mapping; use is lower-cased, dates ISO', () => {
    const r = mapParcelFeature({ ref: ' P-1 ', use: 'Grassland', till: '20190304', area: '2.5' }, m);
    expect(r.reference).toBe('P-1');
    expect(r.fields).toMatchObject({ landUse: 'grassland', lastTillage: '2019-03-04', statedArea: { value: 2.5, unit: 'acres' } });
    expect(r.issues).toEqual([]);
  });

  it('reports, never guesses, bad dates, areas and missing references', () => {
    const r = mapParcelFeature({ ref: '', use: 'x', till: '31/02/2019', area: 'about 3' }, m);
    expect(r.issues.map((i) => i.code)).toEqual(['no-reference', 'bad-date', 'bad-area', 'bad-land-use']);
    expect(readDate('2019-02-29').bad).toBe(true); // 2019 is not a leap year (calendar, common practice)
  });

  it('checks reference classes against the IPCC lists for soil and climate', () => {
    expect(mapReferenceFeature({ c: 'hac' }, { kind: 'soil', classAttribute: 'c' }).cls).toBe('hac');
    expect(mapReferenceFeature({ c: 'clay' }, { kind: 'soil', classAttribute: 'c' }).issues[0]!.message).toMatch(/Class "clay" is not one of hac, lac/);
    expect(mapReferenceFeature({ c: 'anything' }, { kind: 'slope', classAttribute: 'c' }).issues).toEqual([]);
  });
});

describe('overlay summary', () => {
  it('takes the largest share as the climate region and flags the uncovered part', () => {
    const s = summariseKind('climate', { kind: 'climate', layerVersion: 2, coveredShare: 0.9, classes: [{ class: 'cool-temperate-moist', areaHa: 0.3, share: 0.3 }, { class: 'cool-temperate-dry', areaHa: 0.6, share: 0.6 }] });
    expect(s.dominant).toBe('cool-temperate-dry');
    expect(s.uncoveredShare).toBeCloseTo(0.1, 10);
    expect(s.flag).toBe('10.0 % of the parcel lies outside every unit of the ipcc climate regions layer (version 2).');
  });

  it('does not flag designations a parcel lies outside of, and flags a missing soil layer', () => {
    expect(summariseKind('sensitive', { kind: 'sensitive', layerVersion: 1, coveredShare: 0, classes: [] }).flag).toBeNull();
    expect(summariseKind('soil', undefined).flag).toMatch(/No published soil units/);
  });
});

describe('legend and settings', () => {
  it('gives classes of one kind different colours and different patterns', () => {
    const l = Object.values(legendFor('soil', ['hac', 'lac', 'sandy', 'spodic', 'volcanic', 'wetland', 'organic']));
    expect(new Set(l.map((e) => e.colour)).size).toBe(7);
    expect(new Set(l.map((e) => e.pattern)).size).toBe(7);
  });

  it('uses defaults for missing settings and refuses invalid stored ones', () => {
    expect(readGisSettings([])['validation.area-tolerance-m-per-m']).toBe(1.25); // EU 809/2014 Art. 38(4)
    expect(() => readGisSettings([{ key: 'upload.max-bytes', value: -1 }])).toThrow(/upload\.max-bytes/);
  });
});
