import type { Position } from 'geojson';
import type { Random } from './random';

/**
 * Synthetic field pattern in projected metres: a jittered grid whose neighbouring parcels
 * share their edges exactly (no gaps, no overlaps), some with a small pond as a hole.
 * Rings are closed and follow RFC 7946 winding (outer anticlockwise, hole clockwise).
 */
export interface GridOptions {
  originE: number;
  originN: number;
  cols: number;
  rows: number;
  cellWidthM: number;
  cellHeightM: number;
  /** Maximum node displacement, m (keep below a quarter of the cell size). */
  jitterM: number;
  /** Share of parcels given a pond hole, 0-1. */
  holeShare: number;
  random: Random;
}

export interface GridParcel {
  col: number;
  row: number;
  rings: Position[][];
}

const round2 = (n: number) => Math.round(n * 100) / 100;

export function makeParcelGrid(o: GridOptions): GridParcel[] {
  const node: Position[][] = [];
  for (let c = 0; c <= o.cols; c++) {
    node.push([]);
    for (let r = 0; r <= o.rows; r++) {
      const e = o.originE + c * o.cellWidthM + o.random.range(-o.jitterM, o.jitterM);
      const n = o.originN + r * o.cellHeightM + o.random.range(-o.jitterM, o.jitterM);
      node[c]!.push([round2(e), round2(n)]);
    }
  }
  // A bend in every east-west edge, shared by the parcels above and below it.
  const bend: Position[][] = [];
  for (let c = 0; c < o.cols; c++) {
    bend.push([]);
    for (let r = 0; r <= o.rows; r++) {
      const a = node[c]![r]!;
      const b = node[c + 1]![r]!;
      const t = o.random.range(0.35, 0.65);
      bend[c]!.push([
        round2(a[0]! + t * (b[0]! - a[0]!)),
        round2(a[1]! + t * (b[1]! - a[1]!) + o.random.range(-o.jitterM, o.jitterM) / 2),
      ]);
    }
  }
  const parcels: GridParcel[] = [];
  for (let r = 0; r < o.rows; r++) {
    for (let c = 0; c < o.cols; c++) {
      const outer = [
        node[c]![r]!,
        bend[c]![r]!,
        node[c + 1]![r]!,
        node[c + 1]![r + 1]!,
        bend[c]![r + 1]!,
        node[c]![r + 1]!,
        node[c]![r]!,
      ];
      const rings = [outer.map((p) => [...p])];
      if (o.random.next() < o.holeShare) rings.push(pond(outer, o.random));
      parcels.push({ col: c, row: r, rings });
    }
  }
  return parcels;
}

/** A small square pond (12-20 m side) around the parcel's vertex mean, wound clockwise. */
function pond(outer: Position[], random: Random): Position[] {
  const pts = outer.slice(0, -1);
  const cx = pts.reduce((s, p) => s + p[0]!, 0) / pts.length;
  const cy = pts.reduce((s, p) => s + p[1]!, 0) / pts.length;
  const h = random.range(6, 10);
  return [
    [round2(cx - h), round2(cy - h)],
    [round2(cx - h), round2(cy + h)],
    [round2(cx + h), round2(cy + h)],
    [round2(cx + h), round2(cy - h)],
    [round2(cx - h), round2(cy - h)],
  ];
}
