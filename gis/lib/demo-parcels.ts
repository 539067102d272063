import type { Polygon, Position } from 'geojson';
import { measureGeometry } from '../../src/lib/gis/area';
import { fromWgs84, reproject, type CrsDefinition } from '../../src/lib/gis/crs';
import type { AttributeValue } from '../../src/lib/gis/types';
import { parcelAttributes } from './attributes';
import { makeParcelGrid } from './parcel-grid';
import type { Random } from './random';
import type { RegionSpec } from './regions';

/** A demo parcel in the region's projected CRS (metres); geometry null for a deliberate null shape. */
export interface DemoParcel {
  geometry: Polygon | null;
  properties: Record<string, AttributeValue>;
}

/** Grid origin of a region in its projected CRS, rounded to the metre. */
export function regionOrigin(region: RegionSpec, crs: CrsDefinition): Position {
  return fromWgs84(region.originLonLat, crs).map((n) => Math.round(n));
}

function inBoxes(ring: Position[], origin: Position, boxes: [number, number, number, number][]): boolean {
  const pts = ring.slice(0, -1);
  const x = pts.reduce((s, p) => s + p[0]!, 0) / pts.length - origin[0]!;
  const y = pts.reduce((s, p) => s + p[1]!, 0) / pts.length - origin[1]!;
  return boxes.some((b) => x >= b[0] && x <= b[2] && y >= b[1] && y <= b[3]);
}

/** Ellipsoidal area in ha of a projected polygon, via EPSG:4326 (the figure the app computes). */
export function trueAreaHa(geometry: Polygon, crs: CrsDefinition): number {
  return measureGeometry(reproject(geometry, crs)).areaHa;
}

/** Clean parcels for a region: tiled grid, attributes, stated area = true area to 0.01 ha. */
export function buildParcels(
  region: RegionSpec,
  crs: CrsDefinition,
  random: Random,
  prefix: string,
  holdings: number,
): DemoParcel[] {
  const origin = regionOrigin(region, crs);
  const grid = makeParcelGrid({
    originE: origin[0]!,
    originN: origin[1]!,
    cols: region.cols,
    rows: region.rows,
    cellWidthM: region.cellWidthM,
    cellHeightM: region.cellHeightM,
    jitterM: region.jitterM,
    holeShare: 0.05,
    random,
  });
  return grid.map((cell, index) => {
    const geometry: Polygon = { type: 'Polygon', coordinates: cell.rings };
    const inNeverTilled = inBoxes(cell.rings[0]!, origin, region.layers.neverTilled);
    const properties = parcelAttributes(
      { index, prefix, holdings, inNeverTilled, tropical: region.epsg === 32747 },
      random,
    );
    properties.stated_ha = Math.round(trueAreaHa(geometry, crs) * 100) / 100;
    return { geometry, properties };
  });
}

export interface DefectNote {
  field_ref: string;
  defect: string;
}

/**
 * Deliberate defects for the validation report, applied in place / appended. Returns notes
 * for the manifest. Indices are fixed so the defects are stable across runs.
 */
export function addDefects(parcels: DemoParcel[], prefix: string, areaOff: number[]): DefectNote[] {
  const notes: DefectNote[] = [];
  const ref = (i: number) => String(parcels[i]!.properties.field_ref);
  const ring = (i: number) => parcels[i]!.geometry!.coordinates[0]!;
  for (const i of areaOff) {
    const factor = i % 2 === 0 ? 1.2 : 0.8;
    parcels[i]!.properties.stated_ha = Math.round(Number(parcels[i]!.properties.stated_ha) * factor * 100) / 100;
    notes.push({ field_ref: ref(i), defect: `stated area ×${factor} (area-mismatch)` });
  }
  if (parcels.length < 200) return notes;
  for (const i of [30, 76]) {
    const r = ring(i);
    [r[2], r[3]] = [r[3]!, r[2]!]; // swap two vertices → bow tie
    notes.push({ field_ref: ref(i), defect: 'bow-tie boundary (self-intersection)' });
  }
  ring(149).pop();
  notes.push({ field_ref: ref(149), defect: 'outer ring not closed (repaired on upload)' });
  notes.push({ field_ref: ref(119), defect: `reference changed to ${ref(118)} (duplicate-reference)` });
  parcels[119]!.properties.field_ref = ref(118);
  const base = parcels[49]!;
  const count = parcels.length;
  const extra = (n: number) => `${prefix}-${String(count + n).padStart(4, '0')}`;
  const dup = { geometry: structuredClone(base.geometry), properties: { ...base.properties, field_ref: extra(1) } };
  const p0 = ring(0)[0]!;
  const sliver: Polygon = {
    type: 'Polygon',
    coordinates: [[p0, [p0[0]! + 4, p0[1]!], [p0[0]!, p0[1]! + 3], p0].map((p) => [...p])],
  };
  const tiny = { geometry: sliver, properties: { ...parcels[0]!.properties, field_ref: extra(2), stated_ha: 0 } };
  const empty = { geometry: null, properties: { ...parcels[1]!.properties, field_ref: extra(3), stated_ha: null } };
  parcels.push(dup, tiny, empty);
  notes.push({
    field_ref: extra(1),
    defect: `same geometry as ${String(base.properties.field_ref)} (duplicate-geometry)`,
  });
  notes.push({ field_ref: extra(2), defect: '6 m² triangle (sliver)' });
  notes.push({ field_ref: extra(3), defect: 'null shape (empty-geometry)' });
  return notes;
}
