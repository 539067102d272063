/** Drawing and editing boundaries with snapping to neighbouring parcels (OpenLayers interactions). */
import type OlMap from 'ol/Map';
import GeoJSON from 'ol/format/GeoJSON';
import type { Geometry } from 'ol/geom';
import { Draw, Modify, Snap } from 'ol/interaction';
import type Interaction from 'ol/interaction/Interaction';
import { transformExtent } from 'ol/proj';
import type VectorSource from 'ol/source/Vector';
import { apiFetch } from '../ui/api-client';

const geojson = new GeoJSON({ dataProjection: 'EPSG:4326', featureProjection: 'EPSG:3857' });
/** Snapping needs real geometries; below this zoom the box would hold too many parcels. */
export const EDIT_MIN_ZOOM = 14;

export async function loadSnapTargets(map: OlMap, snap: VectorSource): Promise<void> {
  const extent = transformExtent(map.getView().calculateExtent(map.getSize()), 'EPSG:3857', 'EPSG:4326');
  const bbox = extent.map((n) => n.toFixed(6)).join(',');
  const fc = await apiFetch<object>(`/api/parcels/boundaries?bbox=${bbox}`);
  snap.clear();
  snap.addFeatures(geojson.readFeatures(fc));
}

/** Starts an interaction set; returns a function that removes it again. */
export function startDrawing(map: OlMap, edit: VectorSource, snap: VectorSource, onDrawn: () => void): () => void {
  edit.clear();
  const draw = new Draw({ source: edit, type: 'Polygon' });
  const modify = new Modify({ source: edit });
  const added: Interaction[] = [draw, new Snap({ source: snap }), new Snap({ source: edit })];
  draw.on('drawend', () => {
    map.removeInteraction(draw);
    map.getInteractions().insertAt(map.getInteractions().getLength() - 2, modify);
    onDrawn();
  });
  added.forEach((i) => map.addInteraction(i));
  return () => [...added, modify].forEach((i) => map.removeInteraction(i));
}

export function startEditing(
  map: OlMap,
  edit: VectorSource,
  snap: VectorSource,
  geometry: GeoJSON.MultiPolygon,
): () => void {
  edit.clear();
  edit.addFeatures(geojson.readFeatures({ type: 'Feature', properties: {}, geometry }));
  snap
    .getFeatures()
    .filter((f) => JSON.stringify(geojson.writeGeometryObject(f.getGeometry()!)) === JSON.stringify(geometry))
    .forEach((f) => snap.removeFeature(f));
  const added: Interaction[] = [new Modify({ source: edit }), new Snap({ source: snap }), new Snap({ source: edit })];
  added.forEach((i) => map.addInteraction(i));
  return () => added.forEach((i) => map.removeInteraction(i));
}

/** The edited shape as GeoJSON in EPSG:4326, rounded to 1e-8° (about 1 mm). */
export function editedGeometry(edit: VectorSource): GeoJSON.Polygon | GeoJSON.MultiPolygon | null {
  const f = edit.getFeatures()[0];
  const g = f?.getGeometry() as Geometry | undefined;
  if (!g) return null;
  const out = geojson.writeGeometryObject(g, { decimals: 8 }) as GeoJSON.Polygon | GeoJSON.MultiPolygon;
  return out.type === 'Polygon' || out.type === 'MultiPolygon' ? out : null;
}
