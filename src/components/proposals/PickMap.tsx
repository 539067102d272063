/** The form's map: click a parcel to add it; draw a part inside a chosen parcel. Chosen parcels outlined, parts shaded. */
import 'ol/ol.css';
import { useEffect, useRef, useState } from 'react';
import GeoJSON from 'ol/format/GeoJSON';
import { Draw } from 'ol/interaction';
import VectorLayer from 'ol/layer/Vector';
import VectorSource from 'ol/source/Vector';
import { apiFetch } from '../ui/api-client';
import { createMap, EDIT, type MapHandles } from '../map/map-setup';
import type { MapConfig } from '../map/types';

const geojson = new GeoJSON({ dataProjection: 'EPSG:4326', featureProjection: 'EPSG:3857' });
export type Picked = { parcelId: number; reference: string; areaHa: number | null; part?: GeoJSON.Polygon };
type Props = {
  picked: Picked[];
  onAdd: (p: { parcelId: number; reference: string; areaHa: number | null }) => void;
  drawingFor: number | null;
  onDrawn: (parcelId: number, part: GeoJSON.Polygon) => void;
};

export function PickMap({ picked, onAdd, drawingFor, onDrawn }: Props) {
  const target = useRef<HTMLDivElement>(null);
  const handles = useRef<MapHandles | null>(null);
  const parts = useRef(new VectorSource());
  const outlines = useRef(new Map<number, unknown>());
  const onAddRef = useRef(onAdd);
  onAddRef.current = onAdd;
  const [problem, setProblem] = useState<string | null>(null);
  const [ready, setReady] = useState(false);

  useEffect(() => {
    let disposed = false;
    apiFetch<MapConfig>('/api/map').then(
      (c) => {
        if (disposed || !target.current) return;
        const h = createMap(target.current, c, () => new Set(['sensitive']));
        h.map.addLayer(new VectorLayer({ source: parts.current, style: EDIT }));
        handles.current = h;
        h.map.on('singleclick', (ev) => {
          if (
            h.map
              .getInteractions()
              .getArray()
              .some((i) => i instanceof Draw)
          )
            return;
          const hit = h.map
            .getFeaturesAtPixel(ev.pixel, { layerFilter: (l) => l === h.tileLayer, hitTolerance: 2 })
            .find((f) => f.get('layer') === 'parcels');
          const id = hit?.getId();
          if (id !== undefined)
            onAddRef.current({
              parcelId: Number(id),
              reference: String(hit!.get('reference') ?? id),
              areaHa: hit!.get('area_ha') !== undefined ? Number(hit!.get('area_ha')) : null,
            });
        });
        setReady(true);
      },
      (e: Error) => setProblem(e.message),
    );
    return () => {
      disposed = true;
      handles.current?.map.setTarget(undefined);
    };
  }, []);

  // Outline the chosen parcels (their boundaries from the register) and show their drawn parts.
  useEffect(() => {
    const h = handles.current;
    if (!h || !ready) return;
    const ids = new Set(picked.map((p) => p.parcelId));
    for (const id of [...outlines.current.keys()]) if (!ids.has(id)) outlines.current.delete(id);
    const missing = picked.filter((p) => !outlines.current.has(p.parcelId));
    void Promise.all(
      missing.map((p) =>
        apiFetch<{ geometry: unknown }>(`/api/parcels/${p.parcelId}`).then(
          (d) => outlines.current.set(p.parcelId, d.geometry),
          () => undefined,
        ),
      ),
    ).then(() => {
      h.highlight.clear();
      for (const p of picked) {
        const g = outlines.current.get(p.parcelId);
        if (g) h.highlight.addFeatures(geojson.readFeatures({ type: 'Feature', properties: {}, geometry: g }));
      }
      const fresh = missing.length > 0 && picked.length > 0 && missing.length === picked.length;
      const box = h.highlight.getExtent();
      if (fresh && box && h.highlight.getFeatures().length)
        h.map.getView().fit(box, { padding: [50, 50, 50, 50], maxZoom: 16 });
    });
    parts.current.clear();
    for (const p of picked)
      if (p.part)
        parts.current.addFeatures(geojson.readFeatures({ type: 'Feature', properties: {}, geometry: p.part }));
  }, [picked, ready]);

  // Drawing a part for one parcel.
  useEffect(() => {
    const h = handles.current;
    if (!h || drawingFor === null) return;
    const source = new VectorSource();
    const draw = new Draw({ source, type: 'Polygon' });
    draw.on('drawend', (e) => {
      const g = geojson.writeGeometryObject(e.feature.getGeometry()!, { decimals: 8 }) as GeoJSON.Polygon;
      onDrawn(drawingFor, g);
    });
    h.map.addInteraction(draw);
    return () => void h.map.removeInteraction(draw);
  }, [drawingFor, onDrawn]);

  return (
    <div>
      <div
        ref={target}
        className="h-[26rem] w-full rounded border border-line bg-[#eef1ec]"
        role="region"
        aria-label="Map: click a parcel to add it to the proposal"
        tabIndex={0}
      />
      <p className="mt-1 text-xs text-muted">
        Click a parcel to add it (zoom in until boundaries show). Blue outline: chosen parcels; brown shading: a drawn
        part. Dashed: designated sensitive grassland.
      </p>
      {problem && (
        <p className="notice notice-warn" role="alert">
          The map could not be loaded: {problem}
        </p>
      )}
    </div>
  );
}
