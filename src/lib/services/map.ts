/** The map: its configuration (data version, extent, legend, basemap) and vector tiles cached by data version. */
import { db } from '../db/client';
import { getGisSettings } from '../db/gis-settings';
import { mapVersion, parcelAreas, parcelsInBox, parcelsOfUpload } from '../db/parcels';
import { uploadLabel } from '../gis/upload-name';
import { PARCEL_MIN_ZOOM, renderTile } from '../db/tiles';
import { HttpError } from '../http/errors';
import { currentLegend } from './reference-layers';

export async function mapConfig() {
  const [version, areas, legend, settings] = await Promise.all([mapVersion(db), parcelAreas(db), currentLegend(), getGisSettings(db)]);
  const named = areas.map((a) => ({ id: a.id, label: a.fileName ? uploadLabel(a.fileName, a.savedAt) : 'Parcels drawn on the map', count: a.count, extent: a.extent }));
  return { dataVersion: version, areas: named, legend, basemapUrl: settings['map.basemap-url'], parcelMinZoom: PARCEL_MIN_ZOOM };
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
 * A tile answered with an ETag of the map data version (kept in PostgreSQL, so every
 * instance agrees). A request naming the current version (?v=) may be cached for a day: a
 * change bumps the version and the client asks for new URLs. A matching If-None-Match gets 304.
 */
export async function tileResponse(request: Request, z: number, x: number, y: number, askedVersion: number | undefined): Promise<Response> {
  const max = 2 ** z;
  if (x >= max || y >= max) throw new HttpError('BAD_REQUEST', `Tile ${z}/${x}/${y} does not exist: x and y must be below ${max} at zoom ${z}.`);
  const version = await mapVersion(db);
  const etag = `"m${version}"`;
  const cache = askedVersion === version ? 'private, max-age=86400, immutable' : 'private, no-cache';
  const headers = { etag, 'cache-control': cache, vary: 'Cookie' };
  if (request.headers.get('if-none-match') === etag) return new Response(null, { status: 304, headers });
  const tile = await renderTile(db, z, x, y);
  return new Response(tile as Uint8Array<ArrayBuffer>, { status: 200, headers: { ...headers, 'content-type': 'application/vnd.mapbox-vector-tile' } });
}

export const MAX_SNAP_FEATURES = 1500;

export async function parcelsForSnapping(box: [number, number, number, number]) {
  const [w, s, e, n] = box;
  if (w >= e || s >= n) throw new HttpError('UNPROCESSABLE_CONTENT', 'The box must run west < east and south < north.');
  if ((e - w) * (n - s) > 0.05) throw new HttpError('UNPROCESSABLE_CONTENT', 'Zoom in further: the box is too large for drawing (at most 0.05 square degrees).');
  const rows = await parcelsInBox(db, box, MAX_SNAP_FEATURES);
  return { type: 'FeatureCollection' as const, features: rows.map((r) => ({ type: 'Feature' as const, id: r.id, properties: { id: r.id, reference: r.reference }, geometry: r.geometry })) };
}
