/**
 * The authority's territory (server-only): the stored setting (app_setting 'territory': a
 * GeoJSON Polygon/MultiPolygon in WGS 84, or JSON null for "no check"), the default when nothing
 * is stored (the envelopes of the current reference-layer features, widened by a margin), and
 * which parcels lie outside it or would lie inside with their axes swapped.
 */
import type { MultiPolygon, Polygon } from 'geojson';
import type { Db } from './client';

export const TERRITORY_KEY = 'territory';
/** Margin around the reference layers for the default territory, degrees (about 5 km north–south; common practice). */
export const DEFAULT_MARGIN_DEG = 0.05;
/** A parcel counts as outside when more than this share of it is (rounding at the border is not). */
export const OUTSIDE_SHARE = 0.001;

export type Territory = { geometry: MultiPolygon | null; source: 'setting' | 'reference-layers' | 'none' };

export async function storedTerritory(db: Db): Promise<{ stored: boolean; geometry: Polygon | MultiPolygon | null }> {
  const row = await db('app_setting').select('value').where({ key: TERRITORY_KEY }).first();
  return row ? { stored: true, geometry: row.value ?? null } : { stored: false, geometry: null };
}

export async function storeTerritory(db: Db, geometry: Polygon | MultiPolygon | null, by: string): Promise<void> {
  await db('app_setting')
    .insert({ key: TERRITORY_KEY, value: JSON.stringify(geometry), updated_by: by, updated_at: db.fn.now() })
    .onConflict('key')
    .merge();
}

/** The territory in force: the setting, else the reference layers' extent plus the margin, else none. */
export async function effectiveTerritory(db: Db): Promise<Territory> {
  const s = await storedTerritory(db);
  if (s.stored) {
    if (!s.geometry) return { geometry: null, source: 'none' };
    const r = await db.raw('select st_asgeojson(st_multi(st_geomfromgeojson(?)), 9)::json as g', [
      JSON.stringify(s.geometry),
    ]);
    return { geometry: r.rows[0].g, source: 'setting' };
  }
  const r = await db.raw(
    `select st_asgeojson(st_multi(st_union(st_expand(st_envelope(f.geom), ?))), 9)::json as g
     from reference_feature f
     join (select distinct on (kind) id from reference_layer_version where status = 'published' order by kind, version desc) v on v.id = f.version_id`,
    [DEFAULT_MARGIN_DEG],
  );
  const g = r.rows[0]?.g ?? null;
  return g ? { geometry: g, source: 'reference-layers' } : { geometry: null, source: 'none' };
}

export type OutsideRow = { idx: number; reference: string | null; outsideShare: number; swappedInside: boolean };

const OUTSIDE = (g: string) =>
  `1 - coalesce(st_area(st_intersection(${g}, t.g)::geography) / nullif(st_area(${g}::geography), 0), 0)`;

/** Staged features (not rejected) more than OUTSIDE_SHARE outside the territory. */
export async function stagedOutside(db: Db, stagingId: string, territory: MultiPolygon): Promise<OutsideRow[]> {
  const r = await db.raw(
    `with t as (select st_geomfromgeojson(?) as g)
     select idx, reference, outside as "outsideShare", st_coveredby(st_flipcoordinates(geom), t.g) as "swappedInside"
     from (select f.idx, f.reference, f.geom, case when st_coveredby(f.geom, t.g) then 0 else ${OUTSIDE('f.geom')} end as outside
           from upload_staging_feature f, t where f.staging_id = ? and f.status <> 'rejected' and f.geom is not null) x, t
     where outside > ? order by idx`,
    [JSON.stringify(territory), stagingId, OUTSIDE_SHARE],
  );
  return r.rows;
}

/** How much of one geometry lies outside the territory, and whether it would lie inside with its axes swapped. */
export async function geometryOutside(
  db: Db,
  geometry: MultiPolygon,
  territory: MultiPolygon,
): Promise<{ outsideShare: number; swappedInside: boolean }> {
  const r = await db.raw(
    `with t as (select st_geomfromgeojson(?) as g), p as (select st_geomfromgeojson(?) as g)
     select case when st_coveredby(p.g, t.g) then 0 else ${OUTSIDE('p.g')} end as "outsideShare", ` +
      `st_coveredby(st_flipcoordinates(p.g), t.g) as "swappedInside" from p, t`,
    [JSON.stringify(territory), JSON.stringify(geometry)],
  );
  return r.rows[0];
}
