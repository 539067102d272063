import { describe, expect, it } from 'vitest';
import type { Geometry, Position } from 'geojson';
import { measureGeometry } from '~/lib/gis/area';
import { areaToleranceM2, toSquareMetres } from '~/lib/gis/area-units';
import { crsFromEpsg } from '~/lib/gis/crs-catalogue.server';
import { validateFeatures, type FeatureToValidate } from '~/lib/gis/validate';

/** About 111 m × 111 m at 52°N (0.0016° lon × 0.001° lat), anticlockwise and closed. */
const field = (lon = -16, lat = 52.4): Position[] => [
  [lon, lat],
  [lon + 0.0016, lat],
  [lon + 0.0016, lat + 0.001],
  [lon, lat + 0.001],
  [lon, lat],
];
const poly = (...rings: Position[][]): Geometry => ({ type: 'Polygon', coordinates: rings });
const one = (f: FeatureToValidate, options = {}) => validateFeatures([f], options).features[0]!;
const codes = (f: { issues: { code: string }[] }) => f.issues.map((i) => i.code);

describe('validateFeatures: geometry', () => {
  it('accepts a valid field and returns a MultiPolygon with its ellipsoidal area', () => {
    const r = one({ geometry: poly(field()) });
    expect(r.status).toBe('ok');
    expect(r.geometry).toEqual({ type: 'MultiPolygon', coordinates: [[field()]] });
    expect(r.areaHa).toBeCloseTo(measureGeometry(poly(field()) as never).areaHa, 12);
  });

  it('closes an unclosed ring (repaired)', () => {
    const r = one({ geometry: poly(field().slice(0, -1)) });
    expect(r.status).toBe('repaired');
    expect(codes(r)).toEqual(['ring-not-closed']);
    expect(r.geometry!.coordinates[0]![0]).toEqual(field());
  });

  it('re-orients a clockwise outer ring (RFC 7946 §3.1.6 right-hand rule)', () => {
    const r = one({ geometry: poly([...field()].reverse()) });
    expect(r.status).toBe('repaired');
    expect(codes(r)).toEqual(['ring-orientation']);
    expect(r.issues[0]!.message).toMatch(/outer ring anticlockwise, holes clockwise/);
  });

  it('removes a zero-width spike and repeated points (repaired)', () => {
    const f = field();
    const spiky = [f[0]!, f[1]!, [-15.99, 52.4], f[1]!, f[1]!, f[2]!, f[3]!, f[4]!];
    const r = one({ geometry: poly(spiky) });
    expect(r.status).toBe('repaired');
    expect(codes(r).sort()).toEqual(['repeated-vertex', 'spike-removed']);
    expect(r.geometry!.coordinates[0]![0]).toEqual(field());
  });

  it('rejects a too-short ring', () => {
    const r = one({
      geometry: poly([
        [0, 0],
        [0.001, 0],
        [0, 0],
      ]),
    });
    expect(r.status).toBe('rejected');
    expect(r.issues[0]!.message).toBe('The outer ring has 2 distinct points; a ring needs at least 3.');
  });

  it('rejects a bow tie (self-intersection) naming the place', () => {
    const f = field();
    const r = one({ geometry: poly([f[0]!, f[2]!, f[1]!, f[3]!, f[0]!]) });
    expect(r.status).toBe('rejected');
    expect(codes(r)).toEqual(['self-intersection']);
    expect(r.issues[0]!.message).toMatch(/crosses or touches itself near \(-1[56]\.\d{6}, 52\.\d{6}\)/);
    expect(r.geometry).toBeNull();
  });

  it('rejects a hole outside its outer ring', () => {
    const hole = [...field(-15.9)].reverse();
    expect(codes(one({ geometry: poly(field(), hole) }))).toEqual(['hole-outside']);
  });

  it('rejects null, empty and non-polygon geometry with plain messages', () => {
    expect(one({ geometry: null }).issues[0]!.message).toBe('The feature has no geometry.');
    expect(one({ geometry: { type: 'Polygon', coordinates: [] } }).issues[0]!.code).toBe('empty-geometry');
    expect(one({ geometry: { type: 'LineString', coordinates: field() } }).issues[0]!.message).toBe(
      'The geometry is a LineString; parcels must be Polygon or MultiPolygon.',
    );
  });

  it('rejects coordinates outside ±180/±90 and outside the source CRS area of use', async () => {
    expect(one({ geometry: poly(field(200, 52)) }).issues[0]!.message).toMatch(
      /Coordinate \(200, 52\) is not a valid longitude\/latitude/,
    );
    const utm28 = await crsFromEpsg(32628);
    const r = one({ geometry: poly(field(10, 52)) }, { sourceCrs: utm28 });
    expect(r.issues[0]!.message).toMatch(/outside the area of use of WGS 84 \/ UTM zone 28N \(EPSG:32628\)/);
  });

  it('rejects slivers below the configured area', () => {
    const tiny = [
      [-16, 52.4],
      [-16 + 0.00005, 52.4],
      [-16, 52.40004],
      [-16, 52.4],
    ];
    expect(codes(one({ geometry: poly(tiny) }))).toEqual(['sliver']);
    expect(one({ geometry: poly(tiny) }, { minAreaM2: 1 }).status).toBe('ok');
  });
});

describe('validateFeatures: duplicates and stated area', () => {
  it('rejects the later of two features with the same reference or the same geometry', () => {
    const rotated = [...field().slice(2, -1), ...field().slice(0, 3)];
    const report = validateFeatures([
      { geometry: poly(field()), reference: 'CM-1' },
      { geometry: poly(field(-15.99)), reference: ' cm-1 ' },
      { geometry: poly(rotated), reference: 'CM-3' },
    ]);
    expect(report.features.map((f) => f.status)).toEqual(['ok', 'rejected', 'rejected']);
    expect(report.features[1]!.issues[0]!.message).toBe(
      'Parcel reference "cm-1" is also used by feature 1 as "CM-1" (the same once case, width and look-alike letters are set aside).',
    );
    expect(report.features[2]!.issues[0]!.message).toBe('Same geometry as feature 1.');
    expect(report.summary).toEqual({
      total: 3,
      ok: 1,
      repaired: 0,
      rejected: 2,
      byCode: { 'duplicate-reference': 1, 'duplicate-geometry': 1 },
    });
  });

  it('tolerance is 1.25 m × perimeter capped at 1 ha (Implementing Reg. (EU) 809/2014 Art. 38(4))', () => {
    expect(areaToleranceM2(400)).toBe(500);
    expect(areaToleranceM2(8000)).toBe(10_000);
    expect(areaToleranceM2(20_000)).toBe(10_000);
    expect(areaToleranceM2(400, 1.0, 300)).toBe(300);
  });

  it('converts stated units: ha, m2, acres (4 046.856 422 4 m², international acre), decares', () => {
    expect(toSquareMetres(1, 'ha')).toBe(10_000);
    expect(toSquareMetres(1, 'acres')).toBeCloseTo(4_046.8564224, 10);
    expect(toSquareMetres(3, 'decares')).toBe(3_000);
    expect(toSquareMetres(5, 'm2')).toBe(5);
  });

  it('accepts a stated area inside the tolerance and rejects one outside', () => {
    const m = measureGeometry(poly(field()) as never);
    const tol = areaToleranceM2(m.perimeterM);
    const inside = one({ geometry: poly(field()), statedArea: { value: (m.areaM2 + 0.9 * tol) / 10_000, unit: 'ha' } });
    const outside = one({
      geometry: poly(field()),
      statedArea: { value: (m.areaM2 - 1.1 * tol) / 1_000, unit: 'decares' },
    });
    expect(inside.status).toBe('ok');
    expect(outside.status).toBe('rejected');
    expect(outside.issues[0]!.message).toMatch(
      /^Stated area [\d.]+ decares \([\d.]+ ha\) differs from the measured [\d.]+ ha by more than the tolerance of [\d.]+ ha\.$/,
    );
  });

  it('can report an area mismatch as a warning instead', () => {
    const r = one({ geometry: poly(field()), statedArea: { value: 5, unit: 'acres' } }, { areaMismatch: 'warn' });
    expect(r.status).toBe('ok');
    expect(r.issues[0]).toMatchObject({ code: 'area-mismatch', severity: 'warning' });
  });
});
