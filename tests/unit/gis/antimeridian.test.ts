/**
 * Parcels across the antimeridian (RFC 7946 §3.1.9: cut into a MultiPolygon, one part on each
 * side). Areas are checked against GeographicLib's polygon area of the uncut ring, which handles
 * longitudes across ±180° itself (Karney 2013, "Algorithms for geodesics").
 */
import * as geographiclibNs from 'geographiclib-geodesic';
import { describe, expect, it } from 'vitest';
import { crossesAntimeridian, splitAtAntimeridian } from '~/lib/gis/antimeridian';
import { measureGeometry } from '~/lib/gis/area';
import { validateFeatures } from '~/lib/gis/validate';

type GeoLib = typeof geographiclibNs;
const geographiclib: GeoLib = (geographiclibNs as unknown as { default?: GeoLib }).default ?? geographiclibNs;

function karneyAreaM2(ring: number[][]): number {
  const p = geographiclib.Geodesic.WGS84.Polygon(false);
  for (const [lon, lat] of ring.slice(0, -1)) p.AddPoint(lat!, lon!);
  return Math.abs(p.Compute(false, true).area!);
}

// About 2 km × 1.1 km on the antimeridian near 16.5° S (an invented parcel).
const ring = [
  [179.99, -16.5],
  [-179.99, -16.5],
  [-179.99, -16.49],
  [179.99, -16.49],
  [179.99, -16.5],
];

describe('antimeridian', () => {
  it('cuts a crossing ring into two parts at ±180° with the area kept', () => {
    const polygon = { type: 'Polygon' as const, coordinates: [ring] };
    expect(crossesAntimeridian(polygon)).toBe(true);
    const cut = splitAtAntimeridian(polygon);
    expect(cut.coordinates).toHaveLength(2);
    const lons = cut.coordinates.map((part) => part[0]!.map((p) => p[0]!));
    expect(Math.min(...lons[0]!)).toBeCloseTo(179.99, 9);
    expect(Math.max(...lons[0]!)).toBe(180);
    expect(Math.min(...lons[1]!)).toBe(-180);
    expect(measureGeometry(cut).areaM2 / karneyAreaM2(ring)).toBeCloseTo(1, 6);
  });

  it('validation repairs it, names the cut, and keeps the area (also when written past 180°)', () => {
    const continuous = ring.map(([lon, lat]) => [lon! < 0 ? lon! + 360 : lon!, lat!]);
    for (const r of [ring, continuous]) {
      const [f] = validateFeatures([{ geometry: { type: 'Polygon', coordinates: [r] }, reference: 'AM-1' }]).features;
      expect(f!.status).toBe('repaired');
      expect(f!.issues[0]!.code).toBe('antimeridian-split');
      expect(f!.geometry!.coordinates).toHaveLength(2);
      expect((f!.areaHa! * 10_000) / karneyAreaM2(ring)).toBeCloseTo(1, 6);
    }
  });

  it('leaves parcels elsewhere alone, including ones near but not across 180°', () => {
    const near = [
      [179.9, -16.5],
      [179.99, -16.5],
      [179.99, -16.49],
      [179.9, -16.5],
    ];
    expect(crossesAntimeridian({ type: 'Polygon', coordinates: [near] })).toBe(false);
    expect(
      crossesAntimeridian({
        type: 'Polygon',
        coordinates: [
          [
            [-16, 52],
            [-15.9, 52],
            [-15.9, 52.1],
            [-16, 52],
          ],
        ],
      }),
    ).toBe(false);
  });
});
