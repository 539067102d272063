/** The screening map: register parcels over the authority's layers, each permanent-grassland parcel drawn by the level converting it would get. */
import 'ol/ol.css';
import { useEffect, useRef, useState } from 'react';
import type { FeatureLike } from 'ol/Feature';
import { Fill, Stroke, Style } from 'ol/style';
import { LEVELS, RISK_LEVELS, type RiskLevel } from '~/lib/rules/levels';
import { RiskBadge } from '../ui/RiskBadge';
import { apiFetch } from '../ui/api-client';
import { createMap } from '../map/map-setup';
import { fillFor } from '../map/patterns';
import { Swatch } from '../map/Swatch';
import type { MapConfig } from '../map/types';
import { LEVEL_LOOK } from './levels-style';

const PLAIN = new Style({
  stroke: new Stroke({ color: 'rgba(29,35,32,0.45)', width: 0.8 }),
  fill: new Fill({ color: 'rgba(255,255,255,0.01)' }),
});

function levelStyles(): Map<number, Style> {
  return new Map(
    RISK_LEVELS.map((l) => {
      const look = LEVEL_LOOK[l];
      return [
        l,
        new Style({
          fill: new Fill({ color: fillFor(look.colour, look.pattern) }),
          stroke: new Stroke({ color: look.colour, width: look.width }),
        }),
      ];
    }),
  );
}

type Picked = { reference: string; level: number | null; areaHa: number | null };

export function ScreeningMap() {
  const target = useRef<HTMLDivElement>(null);
  const [problem, setProblem] = useState<string | null>(null);
  const [picked, setPicked] = useState<Picked | null>(null);
  useEffect(() => {
    let map: ReturnType<typeof createMap>['map'] | null = null;
    apiFetch<MapConfig>('/api/map').then(
      (config) => {
        if (!target.current) return;
        const h = createMap(target.current, config, () => new Set());
        map = h.map;
        const styles = levelStyles();
        h.tileLayer.setStyle((f: FeatureLike) =>
          f.get('layer') !== 'parcels' ? undefined : (styles.get(Number(f.get('screening_level'))) ?? PLAIN),
        );
        h.map.on('singleclick', (e) => {
          const f = h.map
            .getFeaturesAtPixel(e.pixel, { layerFilter: (l) => l === h.tileLayer })
            .find((x) => x.get('layer') === 'parcels');
          setPicked(
            f
              ? {
                  reference: String(f.get('reference')),
                  level: f.get('screening_level') == null ? null : Number(f.get('screening_level')),
                  areaHa: f.get('area_ha') == null ? null : Number(f.get('area_ha')),
                }
              : null,
          );
        });
      },
      (e: Error) => setProblem(e.message),
    );
    return () => map?.setTarget(undefined);
  }, []);
  return (
    <div className="flex flex-col gap-2">
      <div
        ref={target}
        className="h-96 w-full rounded border border-line bg-[#eef1ec]"
        role="region"
        aria-label="Screening map: parcels by the level converting them would get"
        tabIndex={0}
      />
      <p aria-live="polite" className="min-h-6 text-sm">
        {picked ? (
          <span className="inline-flex flex-wrap items-center gap-2">
            <strong>{picked.reference}</strong>
            {picked.areaHa !== null && <span>{picked.areaHa.toFixed(2)} ha</span>}
            {picked.level ? (
              <RiskBadge level={picked.level as RiskLevel} />
            ) : (
              <span className="text-muted">not screened (not permanent grassland, or no figures)</span>
            )}
          </span>
        ) : (
          <span className="text-muted">Select a parcel on the map to see its level.</span>
        )}
      </p>
      <ul className="flex flex-wrap gap-x-4 gap-y-1 text-sm" aria-label="Legend">
        {RISK_LEVELS.map((l) => (
          <li key={l} className="flex items-center gap-2">
            <Swatch id={`screen-${l}`} colour={LEVEL_LOOK[l].colour} pattern={LEVEL_LOOK[l].pattern} />
            <RiskBadge level={l} />
            <span className="sr-only">{LEVELS[l].meaning}</span>
          </li>
        ))}
        <li className="flex items-center gap-2">
          <span className="inline-block h-4 w-6 border border-[rgba(29,35,32,0.45)]" aria-hidden="true" />
          Not screened
        </li>
      </ul>
      {problem && (
        <p className="notice notice-warn" role="alert">
          The map could not be loaded: {problem}
        </p>
      )}
    </div>
  );
}
