/**
 * A small map of one register entry over the public register tiles: this entry's parcels
 * outlined heavily and hatched, other entries in force drawn lightly. Once the map shows, it hides
 * the server-drawn SVG outline (the fallback without JavaScript).
 */
import { useEffect, useRef } from 'react';
import OlMap from 'ol/Map';
import View from 'ol/View';
import { defaults as defaultControls, ScaleLine } from 'ol/control';
import type { FeatureLike } from 'ol/Feature';
import MVT from 'ol/format/MVT';
import TileLayer from 'ol/layer/Tile';
import VectorTileLayer from 'ol/layer/VectorTile';
import { transformExtent } from 'ol/proj';
import VectorTileSource from 'ol/source/VectorTile';
import XYZ from 'ol/source/XYZ';
import { Fill, Stroke, Style } from 'ol/style';
import 'ol/ol.css';
import { fillFor } from '../map/patterns';

type Props = {
  seq: number;
  headSeq: number;
  extent: [number, number, number, number];
  basemapUrl: string | null;
  fallbackId: string;
  label: string;
};

const OTHER = new Style({
  stroke: new Stroke({ color: '#55605a', width: 1, lineDash: [4, 3] }),
  fill: new Fill({ color: 'rgba(85,96,90,0.08)' }),
});

export function EntryMap({ seq, headSeq, extent, basemapUrl, fallbackId, label }: Props) {
  const target = useRef<HTMLDivElement>(null);
  useEffect(() => {
    if (!target.current) return;
    const source = new VectorTileSource({
      format: new MVT(),
      url: `/api/register/tiles/{z}/{x}/{y}.mvt?v=${headSeq}`,
      maxZoom: 16,
    });
    // The hatch is a canvas pattern: made here, in the browser, never during server rendering.
    const THIS = [
      new Style({ stroke: new Stroke({ color: '#ffffff', width: 5 }) }),
      new Style({
        stroke: new Stroke({ color: '#15382a', width: 2.5 }),
        fill: new Fill({ color: fillFor('#245a41', 'hatch') }),
      }),
    ];
    const style = (f: FeatureLike) => (Number(f.get('seq')) === seq ? THIS : OTHER);
    const map = new OlMap({
      target: target.current,
      layers: [
        ...(basemapUrl ? [new TileLayer({ source: new XYZ({ url: basemapUrl, crossOrigin: 'anonymous' }) })] : []),
        new VectorTileLayer({ source, style, renderMode: 'hybrid' }),
      ],
      controls: defaultControls({ attribution: false, rotate: false }).extend([new ScaleLine({ units: 'metric' })]),
      view: new View({ center: [0, 0], zoom: 2, maxZoom: 19 }),
    });
    map.getView().fit(transformExtent(extent, 'EPSG:4326', 'EPSG:3857'), { padding: [40, 40, 40, 40], maxZoom: 17 });
    map.once('rendercomplete', () => {
      const fallback = document.getElementById(fallbackId);
      fallback?.setAttribute('hidden', '');
      target.current?.setAttribute('data-ready', 'true');
    });
    return () => map.setTarget(undefined);
  }, [seq, headSeq, extent, basemapUrl, fallbackId]);
  return (
    <div
      ref={target}
      className="h-72 w-full rounded border border-line bg-sward-50 md:h-96"
      role="region"
      aria-label={label}
    />
  );
}
