/** A read-only map of a proposal's parcels (outlined) and any drawn parts (hatched), over the register's tiles. */
import 'ol/ol.css';
import { useEffect, useRef, useState } from 'react';
import GeoJSON from 'ol/format/GeoJSON';
import { apiFetch } from '../ui/api-client';
import { createMap } from '../map/map-setup';
import type { MapConfig } from '../map/types';

const geojson = new GeoJSON({ dataProjection: 'EPSG:4326', featureProjection: 'EPSG:3857' });
export type MapParcel = { reference: string; geometry: unknown; part: unknown };

export function ProposalMap({ parcels, label }: { parcels: MapParcel[]; label: string }) {
  const target = useRef<HTMLDivElement>(null);
  const [problem, setProblem] = useState<string | null>(null);
  useEffect(() => {
    let map: ReturnType<typeof createMap>['map'] | null = null;
    apiFetch<MapConfig>('/api/map').then(
      (c) => {
        if (!target.current) return;
        const h = createMap(target.current, c, () => new Set(['sensitive']));
        map = h.map;
        for (const p of parcels) {
          h.highlight.addFeatures(geojson.readFeatures({ type: 'Feature', properties: {}, geometry: p.geometry }));
          if (p.part) h.edit.addFeatures(geojson.readFeatures({ type: 'Feature', properties: {}, geometry: p.part }));
        }
        const box = h.highlight.getExtent();
        if (parcels.length && box) h.map.getView().fit(box, { padding: [40, 40, 40, 40], maxZoom: 17 });
      },
      (e: Error) => setProblem(e.message),
    );
    return () => map?.setTarget(undefined);
  }, [parcels]);
  return (
    <div>
      <div
        ref={target}
        className="h-80 w-full rounded border border-line bg-[#eef1ec]"
        role="region"
        aria-label={label}
        tabIndex={0}
      />
      <p className="mt-1 text-xs text-muted">
        Blue outline: parcels named in the proposal. Brown shading: the part of a parcel drawn for conversion, where
        only a part is proposed. Dashed: designated sensitive grassland.
      </p>
      {problem && (
        <p className="notice notice-warn" role="alert">
          The map could not be loaded: {problem}
        </p>
      )}
    </div>
  );
}
