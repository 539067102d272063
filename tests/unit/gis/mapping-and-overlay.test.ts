import { describe, expect, it } from 'vitest';
import { mapParcelFeature, mapReferenceFeature, parcelMappingSchema, readDate } from '~/lib/gis/field-mapping';
import { summariseKind } from '~/lib/gis/overlay-summary';
import { legendFor, legendForAll } from '~/lib/gis/reference-kinds';
import { readGisSettings } from '~/lib/gis/settings';

describe('column mapping', () => {
  const m = parcelMappingSchema.parse({
    reference: 'ref',
    landUse: 'use',
    lastTillage: 'till',
    statedArea: 'area',
    statedAreaUnit: 'acres',
  });

  it('reads values through the mapping; use is lower-cased, dates ISO', () => {
    const r = mapParcelFeature({ ref: ' P-1 ', use: 'Grassland', till: '20190304', area: '2.5' }, m);
    expect(r.reference).toBe('P-1');
    expect(r.fields).toMatchObject({
      landUse: 'grassland',
      lastTillage: '2019-03-04',
      statedArea: { value: 2.5, unit: 'acres' },
    });
    expect(r.issues).toEqual([]);
  });

  it('reports, never guesses, bad dates, areas and missing references', () => {
    const r = mapParcelFeature({ ref: '', use: 'x', till: '31/02/2019', area: 'about 3' }, m);
    expect(r.issues.map((i) => i.code)).toEqual(['no-reference', 'bad-date', 'bad-area', 'bad-land-use']);
    expect(readDate('2019-02-29').bad).toBe(true); // 2019 is not a leap year (calendar, common practice)
  });

  it('checks reference classes against the IPCC lists for soil and climate', () => {
    expect(mapReferenceFeature({ c: 'hac' }, { kind: 'soil', classAttribute: 'c' }).cls).toBe('hac');
    expect(mapReferenceFeature({ c: 'clay' }, { kind: 'soil', classAttribute: 'c' }).issues[0]!.message).toMatch(
      /Class "clay" is not one of hac, lac/,
    );
    expect(mapReferenceFeature({ c: 'anything' }, { kind: 'slope', classAttribute: 'c' }).issues).toEqual([]);
  });
});

describe('overlay summary', () => {
  it('takes the largest share as the climate region and flags the uncovered part', () => {
    const s = summariseKind('climate', {
      kind: 'climate',
      layerVersion: 2,
      coveredShare: 0.9,
      classes: [
        { class: 'cool-temperate-moist', areaHa: 0.3, share: 0.3 },
        { class: 'cool-temperate-dry', areaHa: 0.6, share: 0.6 },
      ],
    });
    expect(s.dominant).toBe('cool-temperate-dry');
    expect(s.uncoveredShare).toBeCloseTo(0.1, 10);
    expect(s.flag).toBe('10.0 % of the parcel lies outside every unit of the ipcc climate regions layer (version 2).');
  });

  it('does not flag designations a parcel lies outside of, and flags a missing soil layer', () => {
    expect(
      summariseKind('sensitive', { kind: 'sensitive', layerVersion: 1, coveredShare: 0, classes: [] }).flag,
    ).toBeNull();
    expect(summariseKind('soil', undefined).flag).toMatch(/No published soil units/);
  });
});

describe('legend and settings', () => {
  it('gives classes of one kind different colours and different patterns', () => {
    const l = Object.values(legendFor('soil', ['hac', 'lac', 'sandy', 'spodic', 'volcanic', 'wetland', 'organic']));
    expect(new Set(l.map((e) => e.colour)).size).toBe(7);
    expect(new Set(l.map((e) => e.pattern)).size).toBe(7);
  });

  it('gives every class on the map, across layers, its own colour-and-pattern pair; neighbours differ in both', () => {
    // The demo's layers: climate 2, soil 4, sensitive 1, slope 3, never-tilled 1, regions 3 classes.
    const all = legendForAll([
      { kind: 'climate', classes: ['cool-temperate-moist', 'warm-temperate-moist'] },
      { kind: 'soil', classes: ['hac', 'lac', 'sandy', 'wetland'] },
      { kind: 'sensitive', classes: ['sensitive-grassland'] },
      { kind: 'slope', classes: ['gentle', 'moderate', 'steep'] },
      { kind: 'never-tilled', classes: ['never-tilled'] },
      { kind: 'region', classes: ['north', 'south', 'west'] },
    ]);
    const entries = [...all.values()].flatMap((k) => Object.values(k));
    expect(entries).toHaveLength(14);
    expect(new Set(entries.map((e) => `${e.colour}|${e.pattern}`)).size).toBe(14);
    // No two classes share a pattern in the same colour, nor the same pattern among the first ten.
    expect(new Set(entries.slice(0, 10).map((e) => e.pattern)).size).toBe(10);
    for (let i = 1; i < entries.length; i++) {
      expect(entries[i]!.colour).not.toBe(entries[i - 1]!.colour);
      expect(entries[i]!.pattern).not.toBe(entries[i - 1]!.pattern);
    }
  });

  it('uses defaults for missing settings and refuses invalid stored ones', () => {
    expect(readGisSettings([])['validation.area-tolerance-m-per-m']).toBe(1.25); // EU 809/2014 Art. 38(4)
    expect(() => readGisSettings([{ key: 'upload.max-bytes', value: -1 }])).toThrow(/upload\.max-bytes/);
  });
});
