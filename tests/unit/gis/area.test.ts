import proj4 from 'proj4';
import { area as turfArea } from '@turf/turf';
import { describe, expect, it } from 'vitest';
import type { Polygon, Position } from 'geojson';
import { measureGeometry, measureRing } from '~/lib/gis/area';

/** WGS 84 defining parameters (NIMA TR8350.2): a = 6 378 137 m, 1/f = 298.257223563. */
const A = 6_378_137;
const F = 1 / 298.257223563;
const E2 = F * (2 - F);
const E = Math.sqrt(E2);
/** Closed-form surface area of an ellipsoid of revolution: 2πa²(1 + (1−e²)/e · atanh e) (standard geodesy formula). */
const ELLIPSOID_AREA_M2 = 2 * Math.PI * A * A * (1 + ((1 - E2) / E) * Math.atanh(E));

const lonLatSquare = (lon: number, lat: number, d: number): Position[] => [
  [lon, lat],
  [lon + d, lat],
  [lon + d, lat + d],
  [lon, lat + d],
  [lon, lat],
];

/** Independent ellipsoidal area: Lambert azimuthal equal-area (ellipsoidal form, EPSG method 9820) + shoelace. */
function laeaAreaM2(rings: Position[][]): number {
  const [lon0, lat0] = rings[0]![0]!;
  // proj4js 2.22 returns NaN for laea unless +x_0/+y_0 are given explicitly.
  const laea = proj4(
    '+proj=longlat +datum=WGS84',
    `+proj=laea +lat_0=${lat0} +lon_0=${lon0} +x_0=0 +y_0=0 +ellps=WGS84 +units=m`,
  );
  const shoelace = (ring: Position[]) => {
    const xy = ring.map((p) => laea.forward([p[0]!, p[1]!]));
    let s = 0;
    for (let i = 0; i < xy.length - 1; i++) s += xy[i]![0]! * xy[i + 1]![1]! - xy[i + 1]![0]! * xy[i]![1]!;
    return Math.abs(s) / 2;
  };
  return rings.reduce((sum, ring, i) => sum + (i === 0 ? shoelace(ring) : -shoelace(ring)), 0);
}

describe('ellipsoidal area and perimeter (WGS 84)', () => {
  it('large: the octant (equator, two meridians, pole) is one eighth of the ellipsoid area', () => {
    const m = measureRing([
      [0, 0],
      [90, 0],
      [0, 90],
      [0, 0],
    ]);
    expect(m.areaM2 / (ELLIPSOID_AREA_M2 / 8)).toBeCloseTo(1, 12);
    // Perimeter: two meridian quadrants (10 001 965.729 m each, from memory) + a quarter of the equator (πa/2).
    expect(m.perimeterM).toBeCloseTo(2 * 10_001_965.729 + (Math.PI * A) / 2, 2);
  });

  it('near the pole: GeographicLib published test values (geodesictest.js "Planimeter0")', () => {
    const ring = [
      [0, 89],
      [90, 89],
      [180, 89],
      [270, 89],
    ];
    const m = measureRing(ring);
    expect(m.areaM2).toBeCloseTo(24_952_305_678, -1);
    expect(m.perimeterM).toBeCloseTo(631_819.8745, 3);
    expect(measureRing([...ring].reverse()).areaM2).toBeCloseTo(24_952_305_678, -1); // winding does not matter
  });

  it('mid-latitude cell: 0.01° × 0.01° at 52°N is 764 077.618 m² (PostGIS ST_Area(geography), team measurement in stack-notes §4)', () => {
    const m = measureGeometry({ type: 'Polygon', coordinates: [lonLatSquare(0, 52, 0.01)] });
    expect(m.areaM2).toBeCloseTo(764_077.618, 2);
    expect(m.areaHa).toBeCloseTo(76.4077618, 6);
  });

  it('is not the spherical figure: turf.area differs by more than 0.3 % at 52°N', () => {
    const polygon: Polygon = { type: 'Polygon', coordinates: [lonLatSquare(0, 52, 0.01)] };
    const ratio = turfArea(polygon) / measureGeometry(polygon).areaM2;
    expect(Math.abs(1 - ratio)).toBeGreaterThan(0.003);
  });

  it('field with a pond: exterior minus hole, agreeing with an equal-area projection to 1e-6', () => {
    const outer = lonLatSquare(-16.0, 52.4, 0.006);
    const hole = [
      [-15.998, 52.402],
      [-15.998, 52.403],
      [-15.997, 52.403],
      [-15.997, 52.402],
      [-15.998, 52.402],
    ];
    const m = measureGeometry({ type: 'Polygon', coordinates: [outer, hole] });
    const independent = laeaAreaM2([outer, hole]);
    expect(Math.abs(m.areaM2 / independent - 1)).toBeLessThan(1e-6);
    expect(m.perimeterM).toBeCloseTo(measureRing(outer).perimeterM + measureRing(hole).perimeterM, 6);
  });

  it('tropical parcel: agrees with an equal-area projection to 1e-6', () => {
    const ring = [
      [96.3, -7.8],
      [96.302, -7.8],
      [96.3025, -7.7985],
      [96.3001, -7.7982],
      [96.3, -7.8],
    ];
    const m = measureGeometry({ type: 'Polygon', coordinates: [ring] });
    expect(Math.abs(m.areaM2 / laeaAreaM2([ring]) - 1)).toBeLessThan(1e-6);
  });

  it('multipolygon: the sum of its parts', () => {
    const a = lonLatSquare(5, 45, 0.002);
    const b = lonLatSquare(5.01, 45, 0.001);
    const whole = measureGeometry({ type: 'MultiPolygon', coordinates: [[a], [b]] });
    const parts =
      measureGeometry({ type: 'Polygon', coordinates: [a] }).areaM2 +
      measureGeometry({ type: 'Polygon', coordinates: [b] }).areaM2;
    expect(whole.areaM2).toBeCloseTo(parts, 6);
  });
});
