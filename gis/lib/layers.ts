import type { Feature, FeatureCollection, Polygon, Position } from 'geojson';
import { toWgs84, type CrsDefinition } from '../../src/lib/gis/crs';

/** Helpers to build reference-layer polygons in projected metres and publish them in EPSG:4326. */
export type Box = [number, number, number, number];

const DENSIFY_STEP_M = 100;
const round7 = (n: number) => Math.round(n * 1e7) / 1e7;

/** Adds vertices every 100 m so straight projected edges stay faithful once in lon/lat. */
function densify(ring: Position[]): Position[] {
  const out: Position[] = [];
  for (let i = 0; i < ring.length - 1; i++) {
    const a = ring[i]!;
    const b = ring[i + 1]!;
    const steps = Math.max(1, Math.ceil(Math.hypot(b[0]! - a[0]!, b[1]! - a[1]!) / DENSIFY_STEP_M));
    for (let s = 0; s < steps; s++)
      out.push([a[0]! + ((b[0]! - a[0]!) * s) / steps, a[1]! + ((b[1]! - a[1]!) * s) / steps]);
  }
  out.push(ring[ring.length - 1]!);
  return out;
}

/** Projected ring (closed, anticlockwise) → densified lon/lat ring rounded to 1e-7° (~1 cm). */
export function ringTo4326(ring: Position[], crs: CrsDefinition, dense = true): Position[] {
  return (dense ? densify(ring) : ring).map((p) => toWgs84(p, crs).map(round7));
}

/** A rectangle [x0, y0, x1, y1] offset from `origin`, as an anticlockwise closed ring. */
export function boxRing(origin: Position, b: Box): Position[] {
  const [x0, y0, x1, y1] = [origin[0]! + b[0], origin[1]! + b[1], origin[0]! + b[2], origin[1]! + b[3]];
  return [
    [x0, y0],
    [x1, y0],
    [x1, y1],
    [x0, y1],
    [x0, y0],
  ];
}

export function polygonFeature(
  ring: Position[],
  properties: Record<string, string>,
  crs: CrsDefinition,
): Feature<Polygon> {
  return { type: 'Feature', properties, geometry: { type: 'Polygon', coordinates: [ringTo4326(ring, crs)] } };
}

/** One feature per box, all with class `cls` plus extra properties. */
export function boxFeatures(
  origin: Position,
  crs: CrsDefinition,
  cls: string,
  boxes: Box[],
  extra: Record<string, string> = {},
): Feature<Polygon>[] {
  return boxes.map((b) => polygonFeature(boxRing(origin, b), { class: cls, ...extra }, crs));
}

export function collection(features: Feature[]): FeatureCollection {
  return { type: 'FeatureCollection', features };
}
