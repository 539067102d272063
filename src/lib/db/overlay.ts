/**
 * Parcel × reference-layer overlay in PostGIS: for each parcel and layer version, the area in
 * each class (ST_Area on geography = ellipsoidal m²) and the covered share. Parcels are joined
 * with the version's pieces (reference_piece: each feature cut by ST_Subdivide when it was
 * written; GiST on both sides), so every test is against a small polygon. Containment first: a
 * parcel inside a piece (ST_Contains(piece, parcel), which for polygons with area is ST_CoveredBy
 * and several times faster) counts its whole ellipsoidal area and needs no ST_Intersection. The
 * pieces of one feature do not overlap, so their areas add up; when pieces of two features of one
 * class meet a parcel (rare), the pieces are unioned, so overlapping features are not counted twice.
 * Only scalars are sorted and grouped; geometry never goes through a sort.
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
  await db.raw(
    `delete from parcel_overlay_run where layer_version_id = any(?::bigint[]) and parcel_id in (select id from parcel where ${f.sql})`,
    [versionIds, ...f.args],
  );
  // The class areas go to a scratch table first, so each run row is written once with its covered share.
  await db.raw('drop table if exists overlay_scratch');
  await db.raw(
    `create temp table overlay_scratch on commit drop as
     with hit as materialized (
       select p.id pid, q.version_id vid, q.class, q.feature_id fid, q.id qid,
              case when st_contains(q.geom, p.geom) then null else st_area(st_intersection(p.geom, q.geom)::geography) end a
       from parcel p join reference_piece q on q.version_id = any(?::bigint[]) and q.geom && p.geom and st_intersects(p.geom, q.geom)
       where ${fp.sql}
     ), whole as materialized (
       select p.id pid, st_area(p.geom::geography) a from parcel p where p.id in (select pid from hit where a is null)
     ), grp as (
       select h.pid, h.vid, h.class, count(distinct h.fid) nf, sum(coalesce(h.a, w.a)) a
       from hit h left join whole w on h.a is null and w.pid = h.pid group by 1, 2, 3
     ), multi as (
       select g.pid, g.vid, g.class,
              st_area(st_union(case when st_contains(q.geom, p.geom) then p.geom else st_intersection(p.geom, q.geom) end)::geography) a
       from grp g join hit h on h.pid = g.pid and h.vid = g.vid and h.class = g.class
       join parcel p on p.id = h.pid join reference_piece q on q.id = h.qid
       where g.nf > 1 group by 1, 2, 3
     )
     select g.pid, g.vid, g.class, coalesce(m.a, g.a) / 10000 area_ha, least(1, coalesce(m.a, g.a) / 10000 / nullif(p.area_ha, 0)) share
     from grp g left join multi m on m.pid = g.pid and m.vid = g.vid and m.class = g.class join parcel p on p.id = g.pid
     where coalesce(m.a, g.a) > 0`,
    [versionIds, ...fp.args],
  );
  // Statistics of the scratch table, so the joins below are planned from its real size (a temp table has none).
  if (bulk) await db.raw('analyze overlay_scratch');
  await db.raw(
    `insert into parcel_overlay_run (parcel_id, layer_version_id, covered_share)
     select p.id, v, least(1, coalesce(s.total, 0))
     from parcel p cross join unnest(?::bigint[]) v
     left join (select pid, vid, sum(share) total from overlay_scratch group by 1, 2) s on s.pid = p.id and s.vid = v
     where ${fp.sql}`,
    [versionIds, ...fp.args],
  );
  await db.raw(
    'insert into parcel_overlay (parcel_id, layer_version_id, class, area_ha, share) select pid, vid, class, area_ha, share from overlay_scratch',
  );
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
  return r.rows.map(
    (row: { kind: ReferenceKind; version: number; covered_share: number; classes: OverlayRow['classes'] }) => ({
      kind: row.kind,
      layerVersion: row.version,
      coveredShare: row.covered_share,
      classes: row.classes,
    }),
  );
}
