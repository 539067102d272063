/**
 * Turns a parcel's overlay rows (area share per class of each current reference layer) into
 * the facts the carbon estimate and the rules read. Pure. A parcel that lies partly or wholly
 * outside the climate or soil layer is flagged with the uncovered share, never guessed.
 */
import { KIND_INFO, REFERENCE_KINDS, type ReferenceKind } from './reference-kinds';

export interface OverlayRow {
  kind: ReferenceKind;
  layerVersion: number;
  /** Share of the parcel inside any unit of the layer, 0-1 (null when never overlaid). */
  coveredShare: number | null;
  classes: { class: string; areaHa: number; share: number }[];
}

export interface KindSummary {
  kind: ReferenceKind;
  layerVersion: number | null;
  /** Classes by descending share. */
  classes: { class: string; areaHa: number; share: number }[];
  /** For climate: the class with the largest share. */
  dominant: string | null;
  uncoveredShare: number;
  /** Plain-words flag when the parcel is not (wholly) covered and the kind needs full cover. */
  flag: string | null;
}

/** Shares below this are rounding noise of the intersection (0.1 % of the parcel). */
export const COVER_EPSILON = 0.001;

export function summariseKind(kind: ReferenceKind, row: OverlayRow | undefined): KindSummary {
  const info = KIND_INFO[kind];
  if (!row) {
    return {
      kind,
      layerVersion: null,
      classes: [],
      dominant: null,
      uncoveredShare: 1,
      flag: info.flagUncovered ? `No published ${info.label.toLowerCase()} layer covers this parcel yet.` : null,
    };
  }
  const classes = [...row.classes].sort((a, b) => b.share - a.share || a.class.localeCompare(b.class));
  const covered = Math.min(1, row.coveredShare ?? classes.reduce((s, c) => s + c.share, 0));
  const uncovered = Math.max(0, 1 - covered);
  let flag: string | null = null;
  if (info.flagUncovered && uncovered > COVER_EPSILON) {
    flag =
      covered <= COVER_EPSILON
        ? `The parcel lies outside every unit of the ${info.label.toLowerCase()} layer (version ${row.layerVersion}).`
        : `${(uncovered * 100).toFixed(1)} % of the parcel lies outside every unit of the ${info.label.toLowerCase()} layer (version ${row.layerVersion}).`;
  }
  const dominant = info.rule === 'largest-share' && classes.length > 0 ? classes[0]!.class : null;
  return { kind, layerVersion: row.layerVersion, classes, dominant, uncoveredShare: uncovered, flag };
}

export function summariseOverlay(rows: OverlayRow[]): Record<ReferenceKind, KindSummary> {
  return Object.fromEntries(
    REFERENCE_KINDS.map((k) => [
      k,
      summariseKind(
        k,
        rows.find((r) => r.kind === k),
      ),
    ]),
  ) as Record<ReferenceKind, KindSummary>;
}
