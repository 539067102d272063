import * as geographiclibNs from 'geographiclib-geodesic';
import type { MultiPolygon, Polygon, Position } from 'geojson';

/**
 * Ellipsoidal (WGS 84) area and perimeter of polygons in EPSG:4326, computed with
 * GeographicLib's geodesic polygon algorithm (C. F. F. Karney, "Algorithms for geodesics",
 * J. Geodesy 87 (2013) 43-55, §6). Edges are geodesics on the WGS 84 ellipsoid. This is the
 * figure of record; never turf's spherical area (about 0.3-0.4 % off at mid latitudes).
 */
type GeoLib = typeof geographiclibNs;
// The package is CommonJS: Node exposes it as the default export, bundlers as named exports.
const geographiclib: GeoLib = (geographiclibNs as unknown as { default?: GeoLib }).default ?? geographiclibNs;
const WGS84 = geographiclib.Geodesic.WGS84;

export const SQUARE_METRES_PER_HECTARE = 10_000;

export interface RingMeasure {
  /** Unsigned ellipsoidal area enclosed by the ring, m². */
  areaM2: number;
  /** Geodesic length of the ring, m. */
  perimeterM: number;
}

export interface AreaMeasure {
  /** Ellipsoidal area (exteriors minus holes), m². */
  areaM2: number;
  /** Same area in hectares (1 ha = 10 000 m²). */
  areaHa: number;
  /** Sum of geodesic lengths of all rings, exterior and holes, m. */
  perimeterM: number;
}

/**
 * Area and perimeter of one ring given as [lon, lat] positions in degrees (closed or not).
 * The area is unsigned and taken as the smaller side of the ring, so winding does not matter
 * for rings smaller than half the ellipsoid.
 */
export function measureRing(ring: Position[]): RingMeasure {
  const polygon = WGS84.Polygon(false);
  const n = ring.length > 1 && samePosition(ring[0]!, ring[ring.length - 1]!) ? ring.length - 1 : ring.length;
  for (let i = 0; i < n; i++) polygon.AddPoint(ring[i]![1]!, ring[i]![0]!);
  const result = polygon.Compute(false, true);
  const signed = result.area ?? 0;
  return { areaM2: Math.abs(signed), perimeterM: result.perimeter };
}

function samePosition(a: Position, b: Position): boolean {
  return a[0] === b[0] && a[1] === b[1];
}

/** Area (exterior minus holes) and perimeter (all rings) of Polygon coordinates in degrees. */
export function measurePolygonRings(rings: Position[][]): AreaMeasure {
  let areaM2 = 0;
  let perimeterM = 0;
  rings.forEach((ring, i) => {
    const m = measureRing(ring);
    areaM2 += i === 0 ? m.areaM2 : -m.areaM2;
    perimeterM += m.perimeterM;
  });
  areaM2 = Math.max(0, areaM2);
  return { areaM2, areaHa: areaM2 / SQUARE_METRES_PER_HECTARE, perimeterM };
}

/** Ellipsoidal area and perimeter of a Polygon or MultiPolygon in EPSG:4326. */
export function measureGeometry(geometry: Polygon | MultiPolygon): AreaMeasure {
  const polygons = geometry.type === 'Polygon' ? [geometry.coordinates] : geometry.coordinates;
  let areaM2 = 0;
  let perimeterM = 0;
  for (const rings of polygons) {
    const m = measurePolygonRings(rings);
    areaM2 += m.areaM2;
    perimeterM += m.perimeterM;
  }
  return { areaM2, areaHa: areaM2 / SQUARE_METRES_PER_HECTARE, perimeterM };
}
