/**
 * How much two parcels overlap, and what that means (pure). Areas are ellipsoidal (PostGIS
 * ST_Area on geography). Two boundaries digitised along the same hedge rarely agree to the
 * centimetre, so a thin overlap along a shared edge is only a warning; above both tolerances
 * (a share of the smaller parcel AND an area) it is an error. Almost the same boundary (the
 * symmetric difference is a small share of the larger parcel) is a duplicate.
 */
import type { ValidationIssue } from './validate-geometry';

export interface OverlapTolerance {
  /** Overlap above this share of the smaller parcel (0-1) … */
  maxShare: number;
  /** … and above this area, m², is an error. */
  maxM2: number;
  /** Symmetric difference at most this share of the larger parcel (0-1): a near-duplicate. */
  nearDuplicateShare: number;
}

export interface OverlapMeasure {
  areaAM2: number;
  areaBM2: number;
  overlapM2: number;
}

export type OverlapKind = 'near-duplicate' | 'overlap' | 'overlap-minor';

/** Overlaps under 1 m² are rounding of shared vertices, not overlaps (common practice). */
export const NEGLIGIBLE_OVERLAP_M2 = 1;

export function classifyOverlap(
  m: OverlapMeasure,
  t: OverlapTolerance,
): { kind: OverlapKind; share: number; differenceM2: number } | null {
  if (m.overlapM2 < NEGLIGIBLE_OVERLAP_M2) return null;
  const differenceM2 = Math.max(0, m.areaAM2 + m.areaBM2 - 2 * m.overlapM2);
  const share = m.overlapM2 / Math.min(m.areaAM2, m.areaBM2);
  if (differenceM2 <= t.nearDuplicateShare * Math.max(m.areaAM2, m.areaBM2))
    return { kind: 'near-duplicate', share, differenceM2 };
  return { kind: share > t.maxShare && m.overlapM2 > t.maxM2 ? 'overlap' : 'overlap-minor', share, differenceM2 };
}

const m2 = (v: number) => (v >= 10_000 ? `${(v / 10_000).toFixed(4)} ha` : `${v.toFixed(1)} m²`);
const pct = (v: number) => `${(v * 100).toFixed(v < 0.01 ? 2 : 1)} %`;

/** The issue for the feature that overlaps `other` ("feature 3 (P-12)" or "parcel P-12 in the register"), or null. */
export function overlapIssue(
  m: OverlapMeasure,
  t: OverlapTolerance,
  self: string,
  other: string,
): ValidationIssue | null {
  const c = classifyOverlap(m, t);
  if (!c) return null;
  if (c.kind === 'near-duplicate') {
    return {
      code: 'near-duplicate',
      message:
        `${self} is almost the same boundary as ${other}: they differ by ${m2(c.differenceM2)} ` +
        `(${pct(c.differenceM2 / Math.max(m.areaAM2, m.areaBM2))} of the larger), within the near-duplicate ` +
        `tolerance of ${pct(t.nearDuplicateShare)}. It is a duplicate.`,
      severity: 'error',
    };
  }
  const what = `${self} overlaps ${other} by ${m2(m.overlapM2)} (${pct(c.share)} of the smaller parcel)`;
  return c.kind === 'overlap'
    ? {
        code: 'overlap',
        message: `${what}, more than the tolerance of ${pct(t.maxShare)} and ${m2(t.maxM2)}.`,
        severity: 'error',
      }
    : {
        code: 'overlap-minor',
        message: `${what}; within the tolerance (${pct(t.maxShare)} or ${m2(t.maxM2)}), as when both were digitised along the same edge.`,
        severity: 'warning',
      };
}
