/**
 * Parcel × reference-layer overlay in PostGIS: for each parcel and layer version, the area in
 * each class (ST_Area on geography = ellipsoidal m²) and the covered share. Parcels are joined
 * with the version's pieces (reference_piece: each feature cut by ST_Subdivide when the version
 * was made; GiST on both sides), so every test is against a small polygon. Containment first: a
 * parcel covered by a piece is its own piece and needs no ST_Intersection. The pieces of one feature do not overlap, so their
 * areas add up; when two features of one class meet a parcel, the pieces are unioned first, so
 * overlapping features are not counted twice.
 */
import type { ReferenceKind } from '../gis/reference-kinds';
import type { OverlayRow } from '../gis/overlay-summary';
import type { Knex } from 'knex';
import { analyzeAfterBulkWrite } from './bulk';
import type { Db } from './client';

export type ParcelSelector = { batchId: string } | { parcelIds: number[] } | { all: true };

function parcelFilter(sel: ParcelSelector, alias = 'parcel'): { sql: string; args: Knex.Value[] } {
  if ('batchId' in sel) return { sql: `${alias}.batch_id = ?`, args: [sel.batchId] };
  if ('parcelIds' in sel) return { sql: `${alias}.id = any(?::bigint[])`, args: [sel.parcelIds] };
  return { sql: 'true', args: [] };
}

/** (Re)computes the overlay of the selected parcels with the given layer versions. */
export async function computeOverlay(db: Db, sel: ParcelSelector, versionIds: number[]): Promise<void> {
  if (versionIds.length === 0) return;
  const f = parcelFilter(sel);
  // A batch or every parcel is a bulk write; one drawn or edited parcel is not (see analyzeAfterBulkWrite).
  const bulk = !('parcelIds' in sel) || sel.parcelIds.length > 100;
  const fp = parcelFilter(sel, 'p');
  await db.raw(`delete from parcel_overlay_run where layer_version_id = any(?::bigint[]) and parcel_id in (select id from parcel where ${f.sql})`, [versionIds, ...f.args]);
  // The class areas go to a scratch table first, so each run row is written once with its covered share.
  await db.raw('drop table if exists overlay_scratch');
  await db.raw(
    `create temp table overlay_scratch on commit drop as
     with hit as materialized (
       select p.id pid, q.version_id vid, q.class, q.feature_id fid, p.area_ha parcel_ha, p.geom pg, q.geom qg, st_coveredby(p.geom, q.geom) inside
       from parcel p join reference_piece q on q.version_id = any(?::bigint[]) and q.geom && p.geom and st_intersects(p.geom, q.geom)
       where ${fp.sql}
     ), cut as (
       select pid, vid, class, fid, parcel_ha, inside,
              case when inside then pg else st_intersection(pg, qg) end piece
       from hit
     )
     select pid, vid, class, a / 10000 area_ha, least(1, a / 10000 / nullif(parcel_ha, 0)) share
     from (
       select pid, vid, class, parcel_ha,
              case when count(distinct fid) = 1 then sum(st_area(piece::geography))
                   else st_area(st_union(piece)::geography) end a
       from cut
       group by pid, vid, class, parcel_ha
     ) x where a > 0`,
    [versionIds, ...fp.args],
  );
  await db.raw(
    `insert into parcel_overlay_run (parcel_id, layer_version_id, covered_share)
     select p.id, v, least(1, coalesce(s.total, 0))
     from parcel p cross join unnest(?::bigint[]) v
     left join (select pid, vid, sum(share) total from overlay_scratch group by 1, 2) s on s.pid = p.id and s.vid = v
     where ${fp.sql}`,
    [versionIds, ...fp.args],
  );
  await db.raw('insert into parcel_overlay (parcel_id, layer_version_id, class, area_ha, share) select pid, vid, class, area_ha, share from overlay_scratch');
  await db.raw('drop table overlay_scratch');
  if (bulk) await analyzeAfterBulkWrite(db, 'parcel_overlay_run', 'parcel_overlay');
}

/** The overlay rows of one parcel against the current published version of each kind. */
export async function overlayOfParcel(db: Db, parcelId: number): Promise<OverlayRow[]> {
  const r = await db.raw(
    `with cur as (select distinct on (kind) id, kind, version from reference_layer_version where status = 'published' order by kind, version desc)
     select cur.kind, cur.version, run.covered_share,
            coalesce((select json_agg(json_build_object('class', o.class, 'areaHa', o.area_ha, 'share', o.share)) from parcel_overlay o
                      where o.parcel_id = run.parcel_id and o.layer_version_id = run.layer_version_id), '[]') as classes
     from cur join parcel_overlay_run run on run.layer_version_id = cur.id and run.parcel_id = ?`,
    [parcelId],
  );
  return r.rows.map((row: { kind: ReferenceKind; version: number; covered_share: number; classes: OverlayRow['classes'] }) => ({
    kind: row.kind,
    layerVersion: row.version,
    coveredShare: row.covered_share,
    classes: row.classes,
  }));
}
