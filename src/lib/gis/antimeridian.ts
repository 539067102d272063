/**
 * Polygons that cross the antimeridian (pure). RFC 7946 §3.1.9: a geometry crossing it SHOULD
 * be cut in two, each part on its own side, so that no edge spans more than 180° of longitude.
 * A ring is taken to cross when two consecutive vertices are more than 180° apart in longitude
 * (the short way round is meant). Each part is clipped from the ring made continuous (east of
 * 180° written as lon − 360 afterwards) with turf's bboxClip (Sutherland–Hodgman against a
 * half-plane); the geodesic area is unchanged.
 */
import { bboxClip } from '@turf/turf';
import type { Geometry, MultiPolygon, Polygon, Position } from 'geojson';

type Ring = Position[];

const crossesRing = (ring: Ring) => ring.some((p, i) => i > 0 && Math.abs(p[0]! - ring[i - 1]![0]!) > 180);

const wrapLon = (lon: number) => (lon > 180 ? lon - 360 : lon < -180 ? lon + 360 : lon);

/**
 * A ring written continuously past 180° (e.g. 179.9 … 180.1, as some software exports it) has
 * longitudes beyond ±180; when the whole ring spans less than 180° they are wrapped to ±180,
 * which makes it a ring that crosses (and is then split). Other coordinates are left alone.
 */
function wrapped(rings: Ring[]): Ring[] {
  const lons = rings.flatMap((r) => r.map((p) => p[0]!));
  const beyond = lons.some((l) => Math.abs(l) > 180);
  if (
    !beyond ||
    lons.some((l) => !Number.isFinite(l) || Math.abs(l) > 360) ||
    Math.max(...lons) - Math.min(...lons) >= 180
  )
    return rings;
  return rings.map((r) => r.map((p) => [wrapLon(p[0]!), p[1]!]));
}

/** True when any ring of a Polygon or MultiPolygon crosses the antimeridian (an edge longer than 180° of longitude, or written past ±180°). */
export function crossesAntimeridian(geometry: Geometry | null | undefined): boolean {
  if (!geometry || (geometry.type !== 'Polygon' && geometry.type !== 'MultiPolygon')) return false;
  const polygons = geometry.type === 'Polygon' ? [geometry.coordinates] : geometry.coordinates;
  return polygons.some((rings) => rings.length > 0 && wrapped(rings).some((r) => r.length > 1 && crossesRing(r)));
}

/** The ring with longitudes made continuous (west of 0 shifted by +360 where the ring wraps). */
function unwrap(ring: Ring): Ring {
  let offset = 0;
  return ring.map((p, i) => {
    if (i > 0) {
      const d = p[0]! - ring[i - 1]![0]!;
      if (d > 180) offset -= 360;
      else if (d < -180) offset += 360;
    }
    return [p[0]! + offset, p[1]!];
  });
}

function splitPolygon(original: Ring[]): Ring[][] {
  const rings = wrapped(original);
  if (!rings.some(crossesRing)) return [original];
  let continuous = rings.map(unwrap);
  // Put the outer ring east of the antimeridian's west side: its longitudes in (0, 360).
  const minLon = Math.min(...continuous[0]!.map((p) => p[0]!));
  if (minLon < 0) continuous = continuous.map((r) => r.map((p) => [p[0]! + 360, p[1]!]));
  const polygon: Polygon = { type: 'Polygon', coordinates: continuous };
  const parts: Ring[][] = [];
  for (const [box, shift] of [
    [[-1, -90, 180, 90], 0],
    [[180, -90, 541, 90], -360],
  ] as const) {
    const clipped = bboxClip(polygon, [...box]).geometry as Polygon;
    const kept = clipped.coordinates.filter((r) => r.length >= 4);
    if (kept.length > 0 && kept[0]!.length >= 4) parts.push(kept.map((r) => r.map((p) => [p[0]! + shift, p[1]!])));
  }
  return parts;
}

/** Splits every part that crosses the antimeridian; other geometries come back unchanged. */
export function splitAtAntimeridian(geometry: Polygon | MultiPolygon): MultiPolygon {
  const polygons = geometry.type === 'Polygon' ? [geometry.coordinates] : geometry.coordinates;
  return { type: 'MultiPolygon', coordinates: polygons.flatMap(splitPolygon) };
}
