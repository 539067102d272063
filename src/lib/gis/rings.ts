import type { Geometry, Position } from 'geojson';

/** Ring helpers on plain coordinate arrays (any planar or lon/lat coordinates). */
export type Ring = Position[];

/**
 * Twice the signed planar area of a ring (shoelace formula), in squared coordinate units.
 * Positive = counter-clockwise when x points east and y north.
 */
export function ringSignedArea2(ring: Ring): number {
  let sum = 0;
  for (let i = 0, n = ring.length; i < n; i++) {
    const a = ring[i]!;
    const b = ring[(i + 1) % n]!;
    sum += a[0]! * b[1]! - b[0]! * a[1]!;
  }
  return sum;
}

export function isRingClosed(ring: Ring): boolean {
  if (ring.length === 0) return false;
  const first = ring[0]!;
  const last = ring[ring.length - 1]!;
  return first[0] === last[0] && first[1] === last[1];
}

/** Returns the ring with its first position repeated at the end when missing. */
export function closeRing(ring: Ring): Ring {
  return isRingClosed(ring) ? ring : [...ring, [...ring[0]!]];
}

/** Orients a polygon per RFC 7946 §3.1.6: exterior counter-clockwise, holes clockwise. */
export function rewindPolygon(rings: Ring[]): Ring[] {
  return rings.map((ring, i) => {
    const ccw = ringSignedArea2(ring) > 0;
    const wantCcw = i === 0;
    return ccw === wantCcw ? ring : [...ring].reverse();
  });
}

/** True when every ring already follows the RFC 7946 right-hand rule. */
export function isPolygonWoundRfc7946(rings: Ring[]): boolean {
  return rings.every((ring, i) => ringSignedArea2(ring) > 0 === (i === 0));
}

/**
 * Re-orients polygonal geometry to RFC 7946. Used when converting shapefiles, whose
 * convention (ESRI Shapefile Technical Description: outer rings clockwise) is the opposite;
 * that is a format convention, not a defect, so it is not reported as a repair.
 */
export function rewindGeometry<G extends Geometry | null>(geometry: G): G {
  if (geometry === null) return geometry;
  if (geometry.type === 'Polygon') return { type: 'Polygon', coordinates: rewindPolygon(geometry.coordinates) } as G;
  if (geometry.type === 'MultiPolygon')
    return { type: 'MultiPolygon', coordinates: geometry.coordinates.map(rewindPolygon) } as G;
  return geometry;
}

/** Applies `fn` to every position of a geometry (GeometryCollections included). */
export function mapPositions<G extends Geometry>(geometry: G, fn: (p: Position) => Position): G {
  // A foreign "bbox" member would be stale after mapping, so it is dropped.
  const { bbox: _bbox, ...g } = geometry as Geometry;
  switch (g.type) {
    case 'Point':
      return { ...g, coordinates: fn(g.coordinates) } as G;
    case 'MultiPoint':
    case 'LineString':
      return { ...g, coordinates: g.coordinates.map(fn) } as G;
    case 'MultiLineString':
    case 'Polygon':
      return { ...g, coordinates: g.coordinates.map((r) => r.map(fn)) } as G;
    case 'MultiPolygon':
      return { ...g, coordinates: g.coordinates.map((p) => p.map((r) => r.map(fn))) } as G;
    case 'GeometryCollection':
      return { ...g, geometries: g.geometries.map((c) => mapPositions(c, fn)) } as G;
  }
}

/** Visits every position of a geometry. */
export function forEachPosition(geometry: Geometry, fn: (p: Position) => void): void {
  mapPositions(geometry, (p) => {
    fn(p);
    return p;
  });
}

/** [minX, minY, maxX, maxY] of a geometry, or null when it has no positions. */
export function bboxOf(geometry: Geometry): [number, number, number, number] | null {
  const box: [number, number, number, number] = [Infinity, Infinity, -Infinity, -Infinity];
  forEachPosition(geometry, (p) => {
    box[0] = Math.min(box[0], p[0]!);
    box[1] = Math.min(box[1], p[1]!);
    box[2] = Math.max(box[2], p[0]!);
    box[3] = Math.max(box[3], p[1]!);
  });
  return Number.isFinite(box[0]) ? box : null;
}
