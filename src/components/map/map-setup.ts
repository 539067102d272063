/** Builds the OpenLayers map: optional basemap, one vector-tile layer (parcels + reference layers), a highlight and an edit layer. */
import OlMap from 'ol/Map';
import View from 'ol/View';
import { defaults as defaultControls, ScaleLine } from 'ol/control';
import type { FeatureLike } from 'ol/Feature';
import MVT from 'ol/format/MVT';
import TileLayer from 'ol/layer/Tile';
import VectorLayer from 'ol/layer/Vector';
import VectorTileLayer from 'ol/layer/VectorTile';
import { transformExtent } from 'ol/proj';
import VectorSource from 'ol/source/Vector';
import VectorTileSource from 'ol/source/VectorTile';
import XYZ from 'ol/source/XYZ';
import { Fill, Stroke, Style } from 'ol/style';
import CircleStyle from 'ol/style/Circle';
import { fillFor } from './patterns';
import type { MapConfig } from './types';

/** Tile URLs name the data version (immutable per version) and carry the short-lived tile token instead of a session look-up. */
export const tileUrl = (c: Pick<MapConfig, 'dataVersion' | 'tileToken'>) =>
  `/api/tiles/{z}/{x}/{y}.mvt?v=${c.dataVersion}&t=${encodeURIComponent(c.tileToken)}`;

/** Well inside a token's life (10 to 20 minutes, lib/auth/tile-token.ts). */
const TOKEN_REFRESH_MS = 4 * 60_000;

/**
 * Asks for the map configuration again every few minutes, and at once when tiles fail to load (a
 * token that expired while the tab slept), and points the tiles at the new URL when the data version
 * or the token changed. Stops when the map is taken off the page.
 */
function keepTileUrlFresh(map: OlMap, tiles: VectorTileSource): void {
  let busy = false;
  const refresh = () => {
    if (busy) return;
    busy = true;
    fetch('/api/map', { credentials: 'same-origin' })
      .then((r) => (r.ok ? (r.json() as Promise<MapConfig>) : null))
      .then((c) => {
        if (c && tiles.getUrls()?.[0] !== tileUrl(c)) tiles.setUrl(tileUrl(c));
      })
      .catch(() => undefined)
      .finally(() => setTimeout(() => (busy = false), 10_000));
  };
  const timer = setInterval(refresh, TOKEN_REFRESH_MS);
  tiles.on('tileloaderror', refresh);
  map.on('change:target', () => {
    if (!map.getTarget()) clearInterval(timer);
  });
}

const PARCEL = new Style({
  stroke: new Stroke({ color: '#1d2320', width: 1 }),
  fill: new Fill({ color: 'rgba(255,255,255,0.01)' }),
});
const PARCEL_ARABLE = new Style({
  stroke: new Stroke({ color: '#1d2320', width: 1, lineDash: [4, 3] }),
  fill: new Fill({ color: 'rgba(255,255,255,0.01)' }),
});
/** Parcels saved by the upload named in `/map?upload=<id>`: a vermilion outline on a white halo (legend: Legend.tsx). */
export const UPLOADED = [
  new Style({ stroke: new Stroke({ color: '#ffffff', width: 5 }) }),
  new Style({ stroke: new Stroke({ color: '#D55E00', width: 2.5, lineDash: [10, 4] }) }),
];
export const HIGHLIGHT = [
  new Style({ stroke: new Stroke({ color: '#ffffff', width: 6 }) }),
  new Style({ stroke: new Stroke({ color: '#1f5a85', width: 3 }) }),
];
export const EDIT = new Style({
  stroke: new Stroke({ color: '#9a3b17', width: 2.5 }),
  fill: new Fill({ color: 'rgba(154,59,23,0.12)' }),
  image: new CircleStyle({
    radius: 5,
    fill: new Fill({ color: '#9a3b17' }),
    stroke: new Stroke({ color: '#fff', width: 1.5 }),
  }),
});

export type MapHandles = {
  map: OlMap;
  tiles: VectorTileSource;
  tileLayer: VectorTileLayer;
  highlight: VectorSource;
  upload: VectorSource;
  edit: VectorSource;
  snap: VectorSource;
};

/** Style by MVT layer: parcels always (arable dashed), reference features only when their kind is switched on. */
export function styleFor(config: MapConfig, visible: () => Set<string>) {
  const cache = new Map<string, Style>();
  return (feature: FeatureLike) => {
    if (feature.get('layer') === 'parcels') return feature.get('land_use') === 'arable' ? PARCEL_ARABLE : PARCEL;
    const kind = feature.get('kind') as string;
    if (!visible().has(kind)) return undefined;
    const cls = feature.get('class') as string;
    const key = `${kind}|${cls}`;
    let style = cache.get(key);
    if (!style) {
      const e = config.legend.find((l) => l.kind === kind)?.classes[cls];
      const colour = e?.colour ?? '#55605a';
      // Designations are outlined heavier and dashed so they stand out over soil or slope patterns.
      const designation = kind === 'sensitive' || kind === 'never-tilled';
      style = new Style({
        fill: new Fill({ color: fillFor(colour, e?.pattern ?? 'solid') }),
        stroke: new Stroke({ color: colour, width: designation ? 3 : 1.5, lineDash: designation ? [8, 4] : undefined }),
      });
      cache.set(key, style);
    }
    return style;
  };
}

export function createMap(target: HTMLElement, config: MapConfig, visible: () => Set<string>): MapHandles {
  const tiles = new VectorTileSource({ format: new MVT({ idProperty: undefined }), url: tileUrl(config), maxZoom: 16 });
  const tileLayer = new VectorTileLayer({ source: tiles, style: styleFor(config, visible), renderMode: 'hybrid' });
  const highlight = new VectorSource();
  const upload = new VectorSource();
  const edit = new VectorSource();
  const snap = new VectorSource();
  const layers = [
    ...(config.basemapUrl
      ? [new TileLayer({ source: new XYZ({ url: config.basemapUrl, crossOrigin: 'anonymous' }) })]
      : []),
    tileLayer,
    new VectorLayer({ source: upload, style: UPLOADED }),
    new VectorLayer({ source: highlight, style: HIGHLIGHT }),
    new VectorLayer({
      source: snap,
      style: new Style({ stroke: new Stroke({ color: 'rgba(31,90,133,0.5)', width: 1 }) }),
    }),
    new VectorLayer({ source: edit, style: EDIT }),
  ];
  const map = new OlMap({
    target,
    layers,
    controls: defaultControls({ attribution: false }).extend([
      new ScaleLine({ units: 'metric', bar: true, steps: 4, text: true, minWidth: 110 }),
    ]),
    view: new View({ center: [0, 0], zoom: 2, maxZoom: 20 }),
  });
  if (config.areas[0]) fitLonLat(map, config.areas[0].extent);
  keepTileUrlFresh(map, tiles);
  return { map, tiles, tileLayer, highlight, upload, edit, snap };
}

export function fitLonLat(map: OlMap, extent: [number, number, number, number], maxZoom = 15): void {
  map
    .getView()
    .fit(transformExtent(extent, 'EPSG:4326', 'EPSG:3857'), { padding: [30, 30, 30, 30], maxZoom, duration: 0 });
}
