/** Mapbox Vector Tiles straight from PostGIS (ST_AsMVT): parcels and the current reference layers. */
import type { Db } from './client';

/** Below this zoom a tile would hold thousands of parcels; they are left out (the map says so). */
export const PARCEL_MIN_ZOOM = 12;

/**
 * One tile with two layers: "parcels" (id, reference, land_use, area_ha, screening_level; never the owner) from
 * PARCEL_MIN_ZOOM, and "reference" (kind, class, label) at every zoom. Empty tile → 0 bytes. The same statement
 * reads the map data version, so the tile and its version come from one snapshot. Bindings: z, x, y, parcels shown
 * (z >= PARCEL_MIN_ZOOM). Exported so the benchmark's bare reference server runs the very same SQL.
 */
export const TILE_SQL = `with b as (select st_tileenvelope(?, ?, ?) as env),
     cur as (select distinct on (kind) id, kind from reference_layer_version where status = 'published' order by kind, version desc),
     parcels as (
       select st_asmvtgeom(p.geom_3857, b.env, 4096, 64, true) as geom, p.id, p.reference, p.land_use, round(p.area_ha::numeric, 2)::float8 as area_ha,
              s.level as screening_level
       from parcel p cross join b left join screening_result s on s.parcel_id = p.id where ? and p.geom_3857 && b.env
     ),
     refs as (
       select st_asmvtgeom(f.geom_3857, b.env, 4096, 64, true) as geom, cur.kind, f.class, f.label
       from cur join reference_feature f on f.version_id = cur.id, b where f.geom_3857 && b.env
     )
     select coalesce((select st_asmvt(parcels.*, 'parcels', 4096, 'geom', 'id') from parcels where geom is not null), ''::bytea)
         || coalesce((select st_asmvt(refs.*, 'reference', 4096, 'geom') from refs where geom is not null), ''::bytea) as tile,
            coalesce((select version from map_data_version where name = 'map'), 0) as version`;

export const tileBindings = (z: number, x: number, y: number) => [z, x, y, z >= PARCEL_MIN_ZOOM];

/** The tile and the map data version it was drawn at. */
export async function renderTile(
  db: Db,
  z: number,
  x: number,
  y: number,
): Promise<{ tile: Uint8Array; version: number }> {
  const r = await db.raw(TILE_SQL, tileBindings(z, x, y));
  return { tile: new Uint8Array(r.rows[0].tile), version: Number(r.rows[0].version) };
}
