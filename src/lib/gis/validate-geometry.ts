import type { Geometry, MultiPolygon, Position } from 'geojson';
import { closeRing, isPolygonWoundRfc7946, isRingClosed, rewindPolygon, type Ring } from './rings';
import { findSelfIntersection, pointInRing } from './segments';

/**
 * Structural checks and simple repairs of one geometry already in EPSG:4326.
 * Repairs: close an unclosed ring, drop repeated vertices and zero-width spikes, re-orient
 * rings to the RFC 7946 §3.1.6 right-hand rule. Everything else is an error.
 */
export type IssueSeverity = 'error' | 'repaired' | 'warning';

export interface ValidationIssue {
  code: string;
  message: string;
  severity: IssueSeverity;
}

export interface GeometryCheck {
  geometry: MultiPolygon | null;
  issues: ValidationIssue[];
}

const fmt = (p: Position) => `(${p[0]!.toFixed(6)}, ${p[1]!.toFixed(6)})`;

function same(a: Position, b: Position): boolean {
  return a[0] === b[0] && a[1] === b[1];
}

/** Removes consecutive duplicates and A-B-A spikes; returns the cleaned open vertex list. */
function cleanVertices(open: Ring): { ring: Ring; repeated: boolean; spikes: boolean } {
  let repeated = false;
  let spikes = false;
  const out: Ring = [];
  const body = isRingClosed(open) ? open.slice(0, -1) : open;
  for (const p of body) {
    const position = [p[0]!, p[1]!];
    if (out.length > 0 && same(out[out.length - 1]!, position)) {
      repeated = true;
      continue;
    }
    if (out.length > 1 && same(out[out.length - 2]!, position)) {
      out.pop(); // A-B-A: the excursion to B has zero width
      spikes = true;
      continue;
    }
    out.push(position);
  }
  while (out.length > 2 && same(out[0]!, out[out.length - 1]!)) out.pop();
  return { ring: out, repeated, spikes };
}

function checkPolygon(rings: Ring[], part: string, issues: ValidationIssue[]): Ring[] | null {
  const cleaned: Ring[] = [];
  for (const [i, ring] of rings.entries()) {
    const label = `${part}${i === 0 ? 'outer ring' : `hole ${i}`}`;
    if (ring.length > 0 && !isRingClosed(ring)) {
      issues.push({
        code: 'ring-not-closed',
        message: `The ${label} was not closed; its first point was added at the end.`,
        severity: 'repaired',
      });
    }
    const { ring: open, repeated, spikes } = cleanVertices(ring);
    if (repeated)
      issues.push({
        code: 'repeated-vertex',
        message: `Repeated points were removed from the ${label}.`,
        severity: 'repaired',
      });
    if (spikes)
      issues.push({
        code: 'spike-removed',
        message: `A zero-width spike was removed from the ${label}.`,
        severity: 'repaired',
      });
    if (open.length < 3) {
      issues.push({
        code: 'ring-too-short',
        message: `The ${label} has ${open.length} distinct points; a ring needs at least 3.`,
        severity: 'error',
      });
      return null;
    }
    cleaned.push(closeRing(open));
  }
  const crossing = findSelfIntersection(cleaned);
  if (crossing) {
    issues.push({
      code: 'self-intersection',
      message: `The boundary crosses or touches itself near ${fmt(crossing)} (lon, lat).`,
      severity: 'error',
    });
    return null;
  }
  const strayHole = cleaned.slice(1).findIndex((hole) => !pointInRing(hole[0]!, cleaned[0]!));
  if (strayHole >= 0) {
    issues.push({
      code: 'hole-outside',
      message: `Hole ${strayHole + 1} lies outside the outer ring.`,
      severity: 'error',
    });
    return null;
  }
  if (!isPolygonWoundRfc7946(cleaned)) {
    issues.push({
      code: 'ring-orientation',
      message: `Rings of the ${part || 'polygon'} were re-oriented (outer ring anticlockwise, holes clockwise, RFC 7946).`,
      severity: 'repaired',
    });
  }
  return rewindPolygon(cleaned);
}

/** Checks and normalises a geometry to a MultiPolygon; returns null geometry on any error. */
export function checkGeometry(geometry: Geometry | null | undefined): GeometryCheck {
  const issues: ValidationIssue[] = [];
  if (!geometry) {
    return {
      geometry: null,
      issues: [{ code: 'empty-geometry', message: 'The feature has no geometry.', severity: 'error' }],
    };
  }
  if (geometry.type !== 'Polygon' && geometry.type !== 'MultiPolygon') {
    return {
      geometry: null,
      issues: [
        {
          code: 'not-polygon',
          message: `The geometry is a ${geometry.type}; parcels must be Polygon or MultiPolygon.`,
          severity: 'error',
        },
      ],
    };
  }
  const polygons = geometry.type === 'Polygon' ? [geometry.coordinates] : geometry.coordinates;
  const nonEmpty = polygons.filter((rings) => rings.length > 0 && rings[0]!.length > 0);
  if (nonEmpty.length === 0) {
    return {
      geometry: null,
      issues: [{ code: 'empty-geometry', message: 'The geometry has no coordinates.', severity: 'error' }],
    };
  }
  const out: Ring[][] = [];
  for (const [i, rings] of nonEmpty.entries()) {
    const part = nonEmpty.length > 1 ? `part ${i + 1} ` : '';
    const checked = checkPolygon(rings, part, issues);
    if (!checked) return { geometry: null, issues };
    out.push(checked);
  }
  return { geometry: { type: 'MultiPolygon', coordinates: out }, issues };
}
