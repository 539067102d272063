/** Parcels, their land-use events and the map data version (server-only). */
import type { MultiPolygon } from 'geojson';
import { analyzeAfterBulkWrite } from './bulk';
import type { Db } from './client';

export type ParcelRow = {
  id: number;
  reference: string;
  name: string | null;
  land_use: string | null;
  management: string | null;
  owner_ref: string | null;
  stated_area_ha: number | null;
  area_ha: number;
  geometry: MultiPolygon;
  batch_id: string | null;
  version: number;
  created_at: Date;
  updated_at: Date;
  batch_file_name: string | null;
  batch_saved_at: Date | null;
  created_by_name: string | null;
};

export type EventRow = {
  id: number;
  event_date: string;
  kind: 'land-use' | 'management' | 'tillage' | 'reseeding';
  value: string | null;
  cultivation: boolean;
  evidence: string;
  recorded_by_name: string | null;
  recorded_at: Date;
};

/** Inserts the non-rejected staged features as parcels; returns how many. */
export async function insertParcelsFromStaging(
  db: Db,
  stagingId: string,
  batchId: string,
  by: string,
): Promise<number> {
  const r = await db.raw(
    `insert into parcel (reference, reference_key, name, land_use, management, owner_ref, stated_area_ha, area_ha, geom, batch_id, created_by, updated_by)
     select f.reference, f.fields->>'referenceKey', f.fields->>'name', f.fields->>'landUse', ` +
      `f.fields->>'management', f.fields->>'ownerRef', (f.fields->>'statedAreaHa')::float8,
            st_area(f.geom::geography) / 10000, f.geom, ?, ?, ?
     from upload_staging_feature f where f.staging_id = ? and f.status <> 'rejected' order by f.idx`,
    [batchId, by, by, stagingId],
  );
  await analyzeAfterBulkWrite(db, 'parcel');
  return r.rowCount ?? 0;
}

/**
 * Land-use history from the mapped columns: current use and management as recorded today, plus dated
 * tillage/reseeding and "in grass since" (a dated grassland event).
 */
export async function insertEventsFromStaging(
  db: Db,
  stagingId: string,
  batchId: string,
  by: string,
  evidence: string,
): Promise<void> {
  // One join of the staged features with their new parcels; each feature gives up to five events,
  // in this order per parcel (ids decide between events of one day).
  await db.raw(
    `insert into land_use_event (parcel_id, event_date, kind, value, evidence, recorded_by, batch_id)
     select p.id, e.d, e.k, e.v, ?, ?, ?::uuid
     from upload_staging_feature f join parcel p on p.reference = f.reference and p.batch_id = ?
     cross join lateral (values
       (current_date, 'land-use', f.fields->>'landUse'),
       (current_date, 'management', f.fields->>'management'),
       ((f.fields->>'lastTillage')::date, 'tillage', null),
       ((f.fields->>'lastReseeding')::date, 'reseeding', null),
       ((f.fields->>'grassSince')::date, 'land-use', 'grassland')
     ) e(d, k, v)
     where f.staging_id = ? and f.status <> 'rejected' and e.d is not null
       and (e.v is not null or e.k in ('tillage', 'reseeding'))`,
    [evidence, by, batchId, batchId, stagingId],
  );
  await analyzeAfterBulkWrite(db, 'land_use_event');
}

export async function getParcel(db: Db, id: number): Promise<ParcelRow | null> {
  const r = await db.raw(
    `select p.id, p.reference, p.name, p.land_use, p.management, p.owner_ref, p.stated_area_ha, p.area_ha, st_asgeojson(p.geom, 8)::json as geometry,
            p.batch_id, p.version, p.created_at, p.updated_at, b.file_name as batch_file_name, b.saved_at as batch_saved_at, u.name as created_by_name
     from parcel p left join upload_batch b on b.id = p.batch_id left join "user" u on u.id = p.created_by where p.id = ?`,
    [id],
  );
  return r.rows[0] ?? null;
}

export async function listEvents(db: Db, parcelId: number): Promise<EventRow[]> {
  return db('land_use_event as e')
    .leftJoin('user as u', 'u.id', 'e.recorded_by')
    .select(
      'e.id',
      db.raw("to_char(e.event_date, 'YYYY-MM-DD') as event_date"),
      'e.kind',
      'e.value',
      'e.cultivation',
      'e.evidence',
      'u.name as recorded_by_name',
      'e.recorded_at',
    )
    .where('e.parcel_id', parcelId)
    .orderBy([{ column: 'e.event_date' }, { column: 'e.id' }]);
}

export async function insertEvent(
  db: Db,
  e: {
    parcelId: number;
    date: string;
    kind: string;
    value: string | null;
    cultivation: boolean;
    evidence: string;
    by: string;
  },
): Promise<number> {
  const [row] = await db('land_use_event')
    .insert({
      parcel_id: e.parcelId,
      event_date: e.date,
      kind: e.kind,
      value: e.value,
      cultivation: e.cultivation,
      evidence: e.evidence,
      recorded_by: e.by,
    })
    .returning('id');
  return row.id;
}

/** Sets land_use / management on the parcel from its newest events of those kinds. */
export async function refreshCurrentState(db: Db, parcelId: number, by: string): Promise<void> {
  const newest = (kind: string) =>
    `(select value from land_use_event where parcel_id = p.id and kind = '${kind}' order by event_date desc, id desc limit 1)`;
  await db.raw(
    `update parcel p set land_use = ${newest('land-use')}, management = ${newest('management')}, version = version ` +
      `+ 1, updated_by = ?, updated_at = now() where id = ?`,
    [by, parcelId],
  );
}

/** Reference of a parcel whose reference has the same key (referenceKey: NFKC, case, look-alikes), if any. */
export async function referenceTaken(db: Db, referenceKey: string, exceptId?: number): Promise<string | null> {
  const q = db('parcel').where('reference_key', referenceKey);
  if (exceptId) q.whereNot('id', exceptId);
  return (await q.first('reference'))?.reference ?? null;
}

/** Reference of a parcel with exactly this boundary, if any. */
export async function sameBoundary(db: Db, geometry: MultiPolygon, exceptId?: number): Promise<string | null> {
  const r = await db.raw(
    `select reference from parcel where geom && st_geomfromgeojson(?) and st_equals(geom, st_geomfromgeojson(?)) and id <> ? limit 1`,
    [JSON.stringify(geometry), JSON.stringify(geometry), exceptId ?? 0],
  );
  return r.rows[0]?.reference ?? null;
}

export async function insertDrawnParcel(
  db: Db,
  p: { reference: string; referenceKey: string; name: string | null; geometry: MultiPolygon; by: string },
): Promise<number> {
  const r = await db.raw(
    `insert into parcel (reference, reference_key, name, area_ha, geom, created_by, updated_by)
     values (?, ?, ?, st_area(st_geomfromgeojson(?)::geography) / 10000, st_geomfromgeojson(?), ?, ?) returning id`,
    [p.reference, p.referenceKey, p.name, JSON.stringify(p.geometry), JSON.stringify(p.geometry), p.by, p.by],
  );
  return r.rows[0].id;
}

export async function updateBoundary(db: Db, id: number, geometry: MultiPolygon, by: string): Promise<void> {
  await db.raw(
    `update parcel set geom = st_geomfromgeojson(?), area_ha = st_area(st_geomfromgeojson(?)::geography) / 10000, ` +
      `version = version + 1, updated_by = ?, updated_at = now() where id = ?`,
    [JSON.stringify(geometry), JSON.stringify(geometry), by, id],
  );
}

/** Parcels (id, reference, boundary) in a lon/lat box, for snapping while drawing. */
export async function parcelsInBox(db: Db, box: [number, number, number, number], limit: number) {
  const r = await db.raw(
    `select id, reference, st_asgeojson(geom, 8)::json as geometry from parcel where geom && st_makeenvelope(?, ?, ?, ?, 4326) order by id limit ?`,
    [...box, limit],
  );
  return r.rows as { id: number; reference: string; geometry: MultiPolygon }[];
}

/**
 * Extent of a group of parcels that stays local across the antimeridian: when longitudes shifted
 * to 0–360 (ST_ShiftLongitude) give a box narrower by more than a degree, that one (east edge
 * beyond 180°) is used. The margin keeps rounding noise (the same box, shifted by 360°, can come out
 * a hair narrower) from moving an ordinary area to longitudes past 180°.
 */
const width = (g: string) => `(st_xmax(st_extent(${g})) - st_xmin(st_extent(${g})))`;
const LOCAL_EXTENT =
  `case when ${width('st_shiftlongitude(p.geom)')} + 1 < ${width('p.geom')} then ` +
  `st_extent(st_shiftlongitude(p.geom)) else st_extent(p.geom) end::geometry`;

/** Where parcels are: one lon/lat extent per upload batch (drawn parcels together), largest first. */
export type ParcelArea = {
  id: string | null;
  fileName: string | null;
  savedAt: Date | null;
  count: number;
  extent: [number, number, number, number];
};

export async function parcelAreas(db: Db, limit = 20): Promise<ParcelArea[]> {
  const r = await db.raw(
    `select id, file_name, saved_at, n, st_xmin(e) w, st_ymin(e) s, st_xmax(e) e, st_ymax(e) n2 from (
       select b.id, b.file_name, count(*)::int as n, ${LOCAL_EXTENT} as e, max(b.saved_at) as saved_at
       from parcel p left join upload_batch b on b.id = p.batch_id group by b.id, b.file_name
     ) x order by n desc, saved_at desc nulls last limit ?`,
    [limit],
  );
  return r.rows.map(
    (x: {
      id: string | null;
      file_name: string | null;
      saved_at: Date | null;
      n: number;
      w: number;
      s: number;
      e: number;
      n2: number;
    }) => ({ id: x.id, fileName: x.file_name, savedAt: x.saved_at, count: x.n, extent: [x.w, x.s, x.e, x.n2] }),
  );
}

/** The parcels an upload saved (still in the register), with their outlines, first `limit` by reference. */
export async function parcelsOfUpload(db: Db, batchId: string, limit: number) {
  const batch = await db('upload_batch')
    .where({ id: batchId, purpose: 'parcels' })
    .first('id', 'file_name', 'saved_at');
  if (!batch) return null;
  const [{ n }] = (await db.raw('select count(*)::int as n from parcel where batch_id = ?', [batchId])).rows;
  const rows = (
    await db.raw(
      `select id::int as id, reference, st_asgeojson(geom, 7)::json as geometry from parcel where batch_id = ? order by reference limit ?`,
      [batchId, limit],
    )
  ).rows as { id: number; reference: string; geometry: GeoJSON.MultiPolygon }[];
  return { fileName: batch.file_name as string, savedAt: batch.saved_at as Date, count: Number(n), rows };
}

export async function bumpMapVersion(db: Db): Promise<number> {
  const r = await db.raw(
    "update map_data_version set version = version + 1, changed_at = now() where name = 'map' returning version",
  );
  return Number(r.rows[0].version);
}

export async function mapVersion(db: Db): Promise<number> {
  const r = await db.raw("select version from map_data_version where name = 'map'");
  return Number(r.rows[0]?.version ?? 0);
}

export async function searchParcels(db: Db, q: string, limit: number) {
  const like = `%${q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
  return db('parcel')
    .select('id', 'reference', 'name', 'area_ha')
    .whereILike('reference', like)
    .orWhereILike('name', like)
    .orderByRaw('lower(reference) = lower(?) desc, reference', [q])
    .limit(limit) as Promise<{ id: number; reference: string; name: string | null; area_ha: number }[]>;
}
