/** The map island: parcels and reference layers as vector tiles, legend, parcel panel, drawing and editing. */
import 'ol/ol.css';
import { useCallback, useEffect, useRef, useState } from 'react';
import GeoJSON from 'ol/format/GeoJSON';
import { apiFetch, ApiError } from '../ui/api-client';
import { BoundaryForm, DrawForm, type DrawValues } from './EditPanel';
import { EDIT_MIN_ZOOM, editedGeometry, loadSnapTargets, startDrawing, startEditing } from './edit-interactions';
import { EventForm } from './EventForm';
import { Legend } from './Legend';
import { createMap, fitLonLat, tileUrl, type MapHandles } from './map-setup';
import { ParcelPanel } from './ParcelPanel';
import { ParcelSearch } from './ParcelSearch';
import type { MapConfig, ParcelDetail } from './types';
import { UploadList, type UploadOnMap } from './UploadList';

const geojson = new GeoJSON({ dataProjection: 'EPSG:4326', featureProjection: 'EPSG:3857' });
type Mode = 'view' | 'draw' | 'edit';

export function ParcelMap({ canEdit }: { canEdit: boolean }) {
  const target = useRef<HTMLDivElement>(null);
  const handles = useRef<MapHandles | null>(null);
  const stopEditing = useRef<(() => void) | null>(null);
  const [config, setConfig] = useState<MapConfig | null>(null);
  const [visible, setVisible] = useState(() => new Set(['soil', 'sensitive']));
  const visibleRef = useRef(visible);
  const [detail, setDetail] = useState<ParcelDetail | null>(null);
  const [mode, setMode] = useState<Mode>('view');
  const [drawn, setDrawn] = useState(false);
  const [busy, setBusy] = useState(false);
  const [note, setNote] = useState<{ ok: boolean; text: string } | null>(null);
  const [zoom, setZoom] = useState(0);
  const [upload, setUpload] = useState<UploadOnMap | null>(null);

  const select = useCallback(async (id: number, fit = false, focus = true) => {
    const h = handles.current;
    try {
      const d = await apiFetch<ParcelDetail>(`/api/parcels/${id}`);
      setDetail(d);
      h?.highlight.clear();
      h?.highlight.addFeatures(geojson.readFeatures({ type: 'Feature', properties: {}, geometry: d.geometry }));
      const box = h?.highlight.getExtent();
      if (fit && h && box) h.map.getView().fit(box, { padding: [60, 60, 60, 60], maxZoom: 17 });
      if (focus) setTimeout(() => document.getElementById('parcel-heading')?.focus(), 0);
    } catch (e) {
      setNote({ ok: false, text: e instanceof ApiError ? e.message : 'The parcel could not be loaded.' });
    }
  }, []);

  useEffect(() => {
    let disposed = false;
    apiFetch<MapConfig>('/api/map').then(
      (c) => {
        if (disposed || !target.current) return;
        setConfig(c);
        const h = createMap(target.current, c, () => visibleRef.current);
        handles.current = h;
        setZoom(h.map.getView().getZoom() ?? 0);
        h.map.getView().on('change:resolution', () => setZoom(h.map.getView().getZoom() ?? 0));
        h.map.on('singleclick', (ev) => {
          if (stopEditing.current) return;
          const hit = h.map
            .getFeaturesAtPixel(ev.pixel, { layerFilter: (l) => l === h.tileLayer, hitTolerance: 2 })
            .find((f) => f.get('layer') === 'parcels');
          const id = hit?.getId();
          if (id !== undefined) void select(Number(id));
        });
        // A link such as /map?parcel=42 (from the screening table) opens that parcel.
        const linked = new URLSearchParams(window.location.search).get('parcel');
        if (linked && /^\d{1,9}$/.test(linked)) void select(Number(linked), true, false);
        // /map?upload=<id> (the upload wizard links here after saving) outlines and lists what that upload saved.
        const saved = new URLSearchParams(window.location.search).get('upload');
        if (saved && /^[0-9a-f-]{36}$/i.test(saved)) {
          apiFetch<UploadOnMap>(`/api/map/uploads/${saved}`).then(
            (u) => {
              if (disposed) return;
              setUpload(u);
              h.upload.addFeatures(
                u.parcels.map((p) =>
                  geojson.readFeature({ type: 'Feature', id: p.id, properties: {}, geometry: p.geometry }),
                ) as never,
              );
              const box = h.upload.getExtent();
              if (!linked && box && u.parcels.length)
                h.map.getView().fit(box, { padding: [40, 40, 40, 40], maxZoom: 16 });
            },
            (e: Error) => setNote({ ok: false, text: e.message }),
          );
        }
      },
      (e: Error) => setNote({ ok: false, text: e.message }),
    );
    return () => {
      disposed = true;
      handles.current?.map.setTarget(undefined);
    };
  }, [select]);

  const toggle = (kind: string) => {
    const next = new Set(visible);
    if (next.has(kind)) next.delete(kind);
    else next.add(kind);
    visibleRef.current = next;
    setVisible(next);
    handles.current?.tileLayer.changed();
  };

  async function refreshTiles() {
    const c = await apiFetch<MapConfig>('/api/map');
    setConfig(c);
    handles.current?.tiles.setUrl(tileUrl(c));
  }

  function endEditing() {
    stopEditing.current?.();
    stopEditing.current = null;
    handles.current?.edit.clear();
    handles.current?.snap.clear();
    setMode('view');
    setDrawn(false);
  }

  async function begin(next: Mode) {
    const h = handles.current;
    if (!h) return;
    setNote(null);
    if ((h.map.getView().getZoom() ?? 0) < EDIT_MIN_ZOOM)
      return setNote({
        ok: false,
        text: `Zoom in to level ${EDIT_MIN_ZOOM} or closer to draw, so boundaries can snap to their neighbours.`,
      });
    try {
      await loadSnapTargets(h.map, h.snap);
    } catch (e) {
      return setNote({
        ok: false,
        text: e instanceof ApiError ? e.message : 'Neighbouring boundaries could not be loaded.',
      });
    }
    stopEditing.current =
      next === 'draw'
        ? startDrawing(h.map, h.edit, h.snap, () => setDrawn(true))
        : startEditing(h.map, h.edit, h.snap, detail!.geometry);
    setMode(next);
  }

  async function saveDrawn(v: DrawValues) {
    const geometry = handles.current && editedGeometry(handles.current.edit);
    if (!geometry) return;
    setBusy(true);
    try {
      const r = await apiFetch<{ id: number }>('/api/parcels', {
        body: {
          reference: v.reference,
          name: v.name || undefined,
          landUse: v.landUse || undefined,
          management: v.management || undefined,
          evidence: v.evidence,
          geometry,
        },
      });
      endEditing();
      await refreshTiles();
      await select(r.id);
      setNote({ ok: true, text: `Parcel ${v.reference} saved.` });
    } catch (e) {
      setNote({ ok: false, text: e instanceof ApiError ? e.message : 'The parcel could not be saved.' });
    } finally {
      setBusy(false);
    }
  }

  async function saveBoundary(reason: string) {
    const geometry = handles.current && editedGeometry(handles.current.edit);
    if (!geometry || !detail) return;
    setBusy(true);
    try {
      const r = await apiFetch<{ areaHa: number }>(`/api/parcels/${detail.id}/boundary`, {
        method: 'PUT',
        body: { geometry, version: detail.version, reason },
      });
      endEditing();
      await refreshTiles();
      await select(detail.id);
      setNote({ ok: true, text: `Boundary of ${detail.reference} saved; area now ${r.areaHa.toFixed(2)} ha.` });
    } catch (e) {
      setNote({ ok: false, text: e instanceof ApiError ? e.message : 'The boundary could not be saved.' });
    } finally {
      setBusy(false);
    }
  }

  async function afterEvent(id: number) {
    await refreshTiles();
    await select(id, false, false);
  }

  const recordForm =
    canEdit && detail ? (
      <EventForm key={detail.id} parcelId={detail.id} onRecorded={() => afterEvent(detail.id)} />
    ) : null;
  const actions =
    canEdit && mode === 'view' && detail ? (
      <button className="btn btn-quiet self-start" onClick={() => void begin('edit')}>
        Edit boundary
      </button>
    ) : null;
  return (
    <div className="grid gap-3 lg:grid-cols-[16rem_minmax(0,1fr)_22rem]">
      <aside
        className="panel order-3 flex min-w-0 flex-col gap-3 lg:order-1"
        aria-label="Find a parcel and choose layers"
      >
        {config && (
          <>
            {upload && (
              <UploadList
                upload={upload}
                onPick={(id) => void select(id, true)}
                onClose={() => (setUpload(null), handles.current?.upload.clear())}
              />
            )}
            <ParcelSearch onPick={(id) => void select(id, true)} />
            {config.areas.length > 1 && (
              <div className="field">
                <label htmlFor="map-area" className="text-sm font-medium text-muted">
                  Show area
                </label>
                <select
                  key={upload?.id ?? 'all'}
                  id="map-area"
                  className="input w-full"
                  defaultValue={Math.max(
                    0,
                    config.areas.findIndex((a) => upload && a.id === upload.id),
                  )}
                  onChange={(e) =>
                    handles.current && fitLonLat(handles.current.map, config.areas[Number(e.target.value)]!.extent)
                  }
                >
                  {config.areas.map((a, i) => (
                    <option key={a.id ?? 'drawn'} value={i}>
                      {a.label} ({a.count.toLocaleString('en-GB')} parcels)
                    </option>
                  ))}
                </select>
              </div>
            )}
            <Legend
              legend={config.legend}
              visible={visible}
              onToggle={toggle}
              parcelMinZoom={config.parcelMinZoom}
              showUpload={upload !== null}
            />
          </>
        )}
      </aside>
      <div className="order-1 flex flex-col gap-2 lg:order-2">
        <div className="flex flex-wrap items-center gap-2 text-sm">
          {canEdit && mode === 'view' && (
            <button className="btn" onClick={() => void begin('draw')}>
              Draw a new parcel
            </button>
          )}
          {config && zoom < config.parcelMinZoom && (
            <span className="text-muted">Zoom in to see parcel boundaries.</span>
          )}
          {note && (
            <span role={note.ok ? 'status' : 'alert'} className={note.ok ? 'notice' : 'notice notice-warn'}>
              {note.ok ? '✓ ' : '⚠ '}
              {note.text}
            </span>
          )}
        </div>
        <div
          ref={target}
          className="h-[60vh] min-h-[22rem] w-full rounded border border-line bg-[#eef1ec] lg:h-[calc(100vh-12rem)]"
          role="region"
          aria-label="Map of parcels and reference layers"
          tabIndex={0}
        />
      </div>
      <aside
        className="panel order-2 overflow-y-auto lg:order-3 lg:max-h-[calc(100vh-10rem)]"
        role="region"
        aria-label="Selected parcel"
        aria-live="polite"
        tabIndex={0}
      >
        {mode === 'draw' && (
          <DrawForm ready={drawn} busy={busy} onSave={(v) => void saveDrawn(v)} onCancel={endEditing} />
        )}
        {mode === 'edit' && detail && (
          <BoundaryForm
            reference={detail.reference}
            busy={busy}
            onSave={(r) => void saveBoundary(r)}
            onCancel={endEditing}
          />
        )}
        {mode === 'view' && detail && (
          <ParcelPanel
            p={detail}
            actions={actions}
            recordForm={recordForm}
            onClose={() => (setDetail(null), handles.current?.highlight.clear())}
          />
        )}
        {mode === 'view' && !detail && (
          <p className="text-sm text-muted">
            Click a parcel on the map, or find it by reference, to see its details here.
          </p>
        )}
      </aside>
    </div>
  );
}
