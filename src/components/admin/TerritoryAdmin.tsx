/**
 * Admin page island: the authority's territory on the map (hatched outline over the parcels and
 * reference layers), where it comes from, and a form to replace it with a GeoJSON polygon or to
 * switch the check off. Uploads and drawn parcels outside it are refused.
 */
import 'ol/ol.css';
import { useEffect, useRef, useState } from 'react';
import GeoJSON from 'ol/format/GeoJSON';
import VectorLayer from 'ol/layer/Vector';
import VectorSource from 'ol/source/Vector';
import { Fill, Stroke, Style } from 'ol/style';
import { createMap, type MapHandles } from '../map/map-setup';
import type { MapConfig } from '../map/types';
import { apiFetch, ApiError } from '../ui/api-client';

type Answer = {
  territory: GeoJSON.MultiPolygon | null;
  source: 'setting' | 'reference-layers' | 'none';
  defaultMarginDeg: number;
};
const geojson = new GeoJSON({ dataProjection: 'EPSG:4326', featureProjection: 'EPSG:3857' });
const OUTLINE = [
  new Style({ stroke: new Stroke({ color: '#ffffff', width: 6 }) }),
  new Style({
    stroke: new Stroke({ color: '#1f5a85', width: 3, lineDash: [10, 6] }),
    fill: new Fill({ color: 'rgba(31,90,133,0.06)' }),
  }),
];

const SOURCE_TEXT: Record<Answer['source'], (m: number) => string> = {
  setting: () => 'Set by an administrator.',
  'reference-layers': (m) =>
    `Not set, so the default applies: the area of the current reference layers widened by ${m}° on every side.`,
  none: () => 'Switched off: uploads and drawn parcels are not checked against a territory.',
};

export function TerritoryAdmin() {
  const target = useRef<HTMLDivElement>(null);
  const handles = useRef<{ map: MapHandles; layer: VectorSource } | null>(null);
  const [answer, setAnswer] = useState<Answer | null>(null);
  const [text, setText] = useState('');
  const [note, setNote] = useState<{ ok: boolean; text: string } | null>(null);

  const show = (a: Answer) => {
    setAnswer(a);
    const h = handles.current;
    if (!h) return;
    h.layer.clear();
    if (a.territory) {
      h.layer.addFeatures(geojson.readFeatures({ type: 'Feature', properties: {}, geometry: a.territory }));
      const box = h.layer.getExtent();
      if (box) h.map.map.getView().fit(box, { padding: [30, 30, 30, 30], maxZoom: 14 });
    }
  };

  useEffect(() => {
    let disposed = false;
    Promise.all([apiFetch<MapConfig>('/api/map'), apiFetch<Answer>('/api/settings/territory')]).then(([config, a]) => {
      if (disposed || !target.current) return;
      const map = createMap(target.current, config, () => new Set(config.legend.map((l) => l.kind)));
      const layer = new VectorSource();
      map.map.addLayer(new VectorLayer({ source: layer, style: OUTLINE }));
      handles.current = { map, layer };
      show(a);
    });
    return () => {
      disposed = true;
      handles.current?.map.map.setTarget(undefined);
    };
  }, []);

  const save = async (territory: unknown) => {
    setNote(null);
    try {
      show(await apiFetch<Answer>('/api/settings/territory', { method: 'PUT', body: { territory } }));
      setNote({ ok: true, text: territory === null ? 'The territory check is off.' : 'Territory saved.' });
    } catch (e) {
      setNote({ ok: false, text: e instanceof ApiError ? e.message : 'The territory could not be saved.' });
    }
  };

  const submit = (ev: React.FormEvent) => {
    ev.preventDefault();
    let parsed: { type?: string; geometry?: unknown } | null = null;
    try {
      parsed = JSON.parse(text);
    } catch {
      setNote({
        ok: false,
        text: 'This is not JSON. Paste a GeoJSON Polygon or MultiPolygon in longitude/latitude (WGS 84).',
      });
      return;
    }
    void save(parsed && parsed.type === 'Feature' ? parsed.geometry : parsed);
  };

  return (
    <div className="grid gap-5 lg:grid-cols-[minmax(0,2fr)_minmax(0,1fr)]">
      <div>
        <div
          ref={target}
          className="h-[420px] w-full rounded border border-[#8d978f]"
          role="region"
          aria-label="Map of the territory"
          tabIndex={0}
        />
        <p className="mt-2 text-xs text-muted">
          The territory is drawn as a dashed blue outline over the parcels and reference layers.
        </p>
      </div>
      <section aria-labelledby="territory-form" className="flex flex-col gap-3">
        <h2 id="territory-form">Where parcels may lie</h2>
        <p className="text-sm" data-testid="territory-source">
          {answer ? SOURCE_TEXT[answer.source](answer.defaultMarginDeg) : 'Loading…'}
        </p>
        <p className="text-sm text-muted">
          Every upload and every drawn or edited boundary is checked against it. A parcel outside is refused; when
          swapping longitude and latitude would put it inside, the message says the axes look swapped.
        </p>
        <form onSubmit={submit} className="flex flex-col gap-2">
          <label htmlFor="territory-geojson" className="text-sm font-medium text-muted">
            New territory: GeoJSON Polygon or MultiPolygon in WGS 84 (longitude, latitude)
          </label>
          <textarea
            id="territory-geojson"
            className="input min-h-32 font-mono text-xs"
            value={text}
            onChange={(e) => setText(e.target.value)}
          />
          <div className="flex flex-wrap gap-2">
            <button type="submit" className="btn" disabled={text.trim() === ''}>
              Save territory
            </button>
            <button type="button" className="btn btn-quiet" onClick={() => void save(null)}>
              Switch the check off
            </button>
          </div>
        </form>
        {note && (
          <p role={note.ok ? 'status' : 'alert'} className={note.ok ? 'text-sm' : 'error-text'}>
            {note.text}
          </p>
        )}
      </section>
    </div>
  );
}
