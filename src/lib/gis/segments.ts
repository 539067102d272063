import type { Position } from 'geojson';

/**
 * Planar segment tests on lon/lat coordinates, used to find self-intersections of parcel
 * rings. Planar tests on degrees are adequate at parcel scale (edges of metres to a few km),
 * where geodesics and straight lines in lon/lat differ by far less than digitising error.
 * Orientation predicate as in computational-geometry textbooks (common practice).
 */
function orient(a: Position, b: Position, c: Position): number {
  const v = (b[0]! - a[0]!) * (c[1]! - a[1]!) - (b[1]! - a[1]!) * (c[0]! - a[0]!);
  return v > 0 ? 1 : v < 0 ? -1 : 0;
}

function onSegment(a: Position, b: Position, p: Position): boolean {
  return (
    Math.min(a[0]!, b[0]!) <= p[0]! &&
    p[0]! <= Math.max(a[0]!, b[0]!) &&
    Math.min(a[1]!, b[1]!) <= p[1]! &&
    p[1]! <= Math.max(a[1]!, b[1]!)
  );
}

/** True when closed segments ab and cd share at least one point. */
export function segmentsIntersect(a: Position, b: Position, c: Position, d: Position): boolean {
  const o1 = orient(a, b, c);
  const o2 = orient(a, b, d);
  const o3 = orient(c, d, a);
  const o4 = orient(c, d, b);
  if (o1 !== o2 && o3 !== o4) return true;
  return (
    (o1 === 0 && onSegment(a, b, c)) ||
    (o2 === 0 && onSegment(a, b, d)) ||
    (o3 === 0 && onSegment(c, d, a)) ||
    (o4 === 0 && onSegment(c, d, b))
  );
}

interface Segment {
  ring: number;
  index: number;
  a: Position;
  b: Position;
  minX: number;
  maxX: number;
}

/**
 * First place where the closed rings of one polygon cross or touch themselves or each other,
 * other than at the shared vertex of consecutive edges. Returns a position near the problem
 * or null. Sweep on x keeps it near O(n log n) for typical parcels.
 */
export function findSelfIntersection(rings: Position[][]): Position | null {
  const segments: Segment[] = [];
  rings.forEach((ring, r) => {
    for (let i = 0; i < ring.length - 1; i++) {
      const a = ring[i]!;
      const b = ring[i + 1]!;
      segments.push({ ring: r, index: i, a, b, minX: Math.min(a[0]!, b[0]!), maxX: Math.max(a[0]!, b[0]!) });
    }
  });
  segments.sort((s, t) => s.minX - t.minX);
  for (let i = 0; i < segments.length; i++) {
    const s = segments[i]!;
    for (let j = i + 1; j < segments.length && segments[j]!.minX <= s.maxX; j++) {
      const t = segments[j]!;
      if (areNeighbours(s, t, rings)) continue;
      if (segmentsIntersect(s.a, s.b, t.a, t.b)) return s.a;
    }
  }
  return null;
}

function areNeighbours(s: Segment, t: Segment, rings: Position[][]): boolean {
  if (s.ring !== t.ring) return false;
  const edges = rings[s.ring]!.length - 1;
  const d = Math.abs(s.index - t.index);
  if (d === 1 || d === edges - 1) {
    // Consecutive edges share one vertex; they still overlap if collinear and folding back.
    const shared = d === 1 ? (s.index < t.index ? s.b : t.b) : s.index === 0 ? s.a : t.a;
    const sOther = s.a === shared ? s.b : s.a;
    const tOther = t.a === shared ? t.b : t.a;
    return !(orient(shared, sOther, tOther) === 0 && dot(shared, sOther, tOther) > 0);
  }
  return false;
}

function dot(o: Position, p: Position, q: Position): number {
  return (p[0]! - o[0]!) * (q[0]! - o[0]!) + (p[1]! - o[1]!) * (q[1]! - o[1]!);
}

/** Even-odd point-in-ring test (ray casting), for positions in the same planar coordinates. */
export function pointInRing(p: Position, ring: Position[]): boolean {
  let inside = false;
  for (let i = 0, j = ring.length - 1; i < ring.length; j = i++) {
    const a = ring[i]!;
    const b = ring[j]!;
    if (a[1]! > p[1]! !== b[1]! > p[1]! && p[0]! < ((b[0]! - a[0]!) * (p[1]! - a[1]!)) / (b[1]! - a[1]!) + a[0]!)
      inside = !inside;
  }
  return inside;
}
