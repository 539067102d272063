import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import type { GisInputError } from '~/lib/gis/errors';
import { epsgFromLegacyCrsName, parseGeoJson } from '~/lib/gis/ingest/geojson';

const square = {
  type: 'Polygon',
  coordinates: [
    [
      [0, 0],
      [0.001, 0],
      [0.001, 0.001],
      [0, 0.001],
      [0, 0],
    ],
  ],
};

function failure(text: string, maxBytes?: number): GisInputError {
  try {
    parseGeoJson(text, maxBytes);
  } catch (error) {
    return error as GisInputError;
  }
  throw new Error('expected parseGeoJson to throw');
}

describe('parseGeoJson (RFC 7946)', () => {
  it('reads a FeatureCollection with properties and column samples, WGS 84 by default (RFC 7946 §4)', () => {
    const text = JSON.stringify({
      type: 'FeatureCollection',
      features: [
        { type: 'Feature', geometry: square, properties: { ref: 'A', ha: 1.5, till: '2020-01-02', tags: ['x'] } },
        { type: 'Feature', geometry: null, properties: null },
      ],
    });
    const layer = parseGeoJson(text);
    expect(layer.epsg).toBe(4326);
    expect(layer.features[0]!.properties).toEqual({ ref: 'A', ha: 1.5, till: '2020-01-02', tags: '["x"]' });
    expect(layer.features[1]).toEqual({ geometry: null, properties: {} });
    expect(layer.columns.map((c) => [c.name, c.kind])).toEqual([
      ['ref', 'text'],
      ['ha', 'number'],
      ['till', 'date'],
      ['tags', 'text'],
    ]);
  });

  it('reads a single Feature and a bare geometry', () => {
    expect(
      parseGeoJson(JSON.stringify({ type: 'Feature', geometry: square, properties: { a: 1 } })).features,
    ).toHaveLength(1);
    expect(parseGeoJson(JSON.stringify(square)).features[0]!.geometry).toEqual(square);
  });

  it('honours a legacy "crs" member with an EPSG code', () => {
    const text = JSON.stringify({
      type: 'FeatureCollection',
      crs: { type: 'name', properties: { name: 'urn:ogc:def:crs:EPSG::32628' } },
      features: [{ type: 'Feature', geometry: square, properties: {} }],
    });
    expect(parseGeoJson(text).epsg).toBe(32628);
    expect(epsgFromLegacyCrsName('EPSG:27700')).toBe(27700);
    expect(epsgFromLegacyCrsName('urn:ogc:def:crs:OGC:1.3:CRS84')).toBe(4326);
  });

  it('rejects an unknown legacy crs, invalid JSON, non-GeoJSON, empty collections and oversize text', () => {
    const crs = JSON.stringify({
      type: 'Feature',
      crs: { type: 'name', properties: { name: 'local-grid' } },
      geometry: square,
      properties: {},
    });
    expect(failure(crs).message).toBe('The GeoJSON "crs" member "local-grid" does not name an EPSG code.');
    expect(failure('{"type": "Feature",').message).toMatch(/^The file is not valid JSON: /);
    const bad = JSON.stringify({
      type: 'FeatureCollection',
      features: [{ type: 'Feature', geometry: { type: 'Polygon', coordinates: [[[0]]] }, properties: {} }],
    });
    expect(failure(bad)).toMatchObject({ code: 'bad-geojson' });
    expect(failure(bad).message).toMatch(/^The file is not GeoJSON \(RFC 7946\)/);
    expect(failure('{"type":"FeatureCollection","features":[]}').message).toBe('The GeoJSON contains no features.');
    expect(failure(JSON.stringify(square), 20).message).toMatch(/^The GeoJSON is \d+ bytes; at most 20 are allowed\.$/);
  });

  it('reads the committed tropical demo parcels', () => {
    const text = readFileSync(new URL('../../../gis/demo/velomari-parcels.geojson', import.meta.url), 'utf8');
    const layer = parseGeoJson(text);
    expect(layer.features).toHaveLength(40);
    expect(layer.columns.map((c) => c.name)).toEqual([
      'field_ref',
      'name',
      'land_use',
      'management',
      'last_till',
      'owner_ref',
      'stated_ha',
    ]);
  });
});
