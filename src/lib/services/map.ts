/** The map: its configuration (data version, tile token, extent, legend, basemap) and vector tiles kept by data version. */
import { LRUCache } from 'lru-cache';
import { db } from '../db/client';
import { getGisSettings } from '../db/gis-settings';
import { issueTileToken } from '../auth/tile-token';
import { mapVersion, parcelAreas, parcelsInBox, parcelsOfUpload } from '../db/parcels';
import { uploadLabel } from '../gis/upload-name';
import { PARCEL_MIN_ZOOM, renderTile } from '../db/tiles';
import { HttpError, keptBytesResponse } from '../http/errors';
import { currentLegend } from './reference-layers';

export async function mapConfig(userId: string) {
  const [version, areas, legend, settings] = await Promise.all([
    mapVersion(db),
    parcelAreas(db),
    currentLegend(),
    getGisSettings(db),
  ]);
  const named = areas.map((a) => ({
    id: a.id,
    label: a.fileName ? uploadLabel(a.fileName, a.savedAt) : 'Parcels drawn on the map',
    count: a.count,
    extent: a.extent,
  }));
  return {
    dataVersion: version,
    tileToken: issueTileToken(userId),
    areas: named,
    legend,
    basemapUrl: settings['map.basemap-url'],
    parcelMinZoom: PARCEL_MIN_ZOOM,
  };
}

export const MAX_UPLOAD_OUTLINES = 2000;

/** The parcels an upload saved, to outline and list on the map (`/map?upload=<id>`). */
export async function uploadOnMap(batchId: string) {
  const u = await parcelsOfUpload(db, batchId, MAX_UPLOAD_OUTLINES);
  if (!u) throw new HttpError('NOT_FOUND', 'No saved parcel upload has that id.');
  return {
    id: batchId,
    label: uploadLabel(u.fileName, u.savedAt),
    count: u.count,
    parcels: u.rows.map((r) => ({ id: r.id, reference: r.reference, geometry: r.geometry })),
  };
}

/**
 * Rendered tiles of a data version, kept in this process by (version, z, x, y). Every change the
 * tiles show bumps the version in the same transaction (map_data_version), and a tile is read in one
 * statement with the version it was drawn at, so a kept tile is a fixed fact of that version, never
 * stale, whichever instance bumped it. Bounded by bytes; the least recently used go first.
 */
const rendered = new LRUCache<string, Uint8Array>({
  maxSize: 64 * 1024 * 1024,
  sizeCalculation: (t) => t.byteLength + 64,
});
/** Versions this process has seen drawn: an If-None-Match naming one of them can be answered without a query. */
const seenVersions = new LRUCache<number, true>({ max: 64 });

/**
 * A tile answered with an ETag of the map data version. A request naming the version it was drawn
 * at (?v=, as the map pages' URLs do) is immutable and may be cached for a day: a change bumps the
 * version and the pages ask for new URLs. Such a request is answered from the kept tiles when this
 * process has drawn it before, else with one statement (tile and version). A matching If-None-Match
 * on a versioned URL gets 304 without a query.
 */
export async function tileResponse(
  request: Request,
  z: number,
  x: number,
  y: number,
  askedVersion: number | undefined,
): Promise<Response> {
  const max = 2 ** z;
  if (x >= max || y >= max)
    throw new HttpError(
      'BAD_REQUEST',
      `Tile ${z}/${x}/${y} does not exist: x and y must be below ${max} at zoom ${z}.`,
    );
  const immutable = { 'cache-control': 'private, max-age=86400, immutable', vary: 'Cookie' };
  if (askedVersion !== undefined && seenVersions.has(askedVersion)) {
    const etag = `"m${askedVersion}"`;
    if (request.headers.get('if-none-match') === etag)
      return new Response(null, { status: 304, headers: { etag, ...immutable } });
    const kept = rendered.get(`${askedVersion}/${z}/${x}/${y}`);
    if (kept) return tileAnswer(kept, { etag, ...immutable });
  }
  const { tile, version } = await renderTile(db, z, x, y);
  seenVersions.set(version, true);
  rendered.set(`${version}/${z}/${x}/${y}`, tile);
  const etag = `"m${version}"`;
  const headers =
    askedVersion === version ? { etag, ...immutable } : { etag, 'cache-control': 'private, no-cache', vary: 'Cookie' };
  if (request.headers.get('if-none-match') === etag) return new Response(null, { status: 304, headers });
  return tileAnswer(tile, headers);
}

/** Kept tiles are shared by every answer that sends them (never changed): sent as they are, with their length. */
const tileAnswer = (tile: Uint8Array, headers: Record<string, string>) =>
  keptBytesResponse(tile, { ...headers, 'content-type': 'application/vnd.mapbox-vector-tile' });

export const MAX_SNAP_FEATURES = 1500;

export async function parcelsForSnapping(box: [number, number, number, number]) {
  const [w, s, e, n] = box;
  if (w >= e || s >= n) throw new HttpError('UNPROCESSABLE_CONTENT', 'The box must run west < east and south < north.');
  if ((e - w) * (n - s) > 0.05)
    throw new HttpError(
      'UNPROCESSABLE_CONTENT',
      'Zoom in further: the box is too large for drawing (at most 0.05 square degrees).',
    );
  const rows = await parcelsInBox(db, box, MAX_SNAP_FEATURES);
  return {
    type: 'FeatureCollection' as const,
    features: rows.map((r) => ({
      type: 'Feature' as const,
      id: r.id,
      properties: { id: r.id, reference: r.reference },
      geometry: r.geometry,
    })),
  };
}
