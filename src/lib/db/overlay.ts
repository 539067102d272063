/**
 * Parcel × reference-layer overlay in PostGIS: for each parcel and layer version, the area in
 * each class (ST_Intersection, union of the pieces per class so overlapping features of one
 * class are not counted twice, ST_Area on geography = ellipsoidal m²) and the covered share.
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
  await db.raw(
    `insert into parcel_overlay_run (parcel_id, layer_version_id, covered_share)
     select p.id, v, 0 from parcel p cross join unnest(?::bigint[]) v where ${fp.sql}`,
    [versionIds, ...fp.args],
  );
  if (bulk) await analyzeAfterBulkWrite(db, 'parcel_overlay_run');
  await db.raw(
    `insert into parcel_overlay (parcel_id, layer_version_id, class, area_ha, share)
     select pid, vid, class, a / 10000, least(1, a / 10000 / nullif(parcel_ha, 0))
     from (
       select p.id pid, r.version_id vid, r.class, p.area_ha parcel_ha,
              case when count(*) = 1 then st_area((array_agg(
                     case when st_coveredby(p.geom, r.geom) then p.geom else st_intersection(p.geom, r.geom) end))[1]::geography)
                   else st_area(st_union(case when st_coveredby(p.geom, r.geom) then p.geom else st_intersection(p.geom, r.geom) end)::geography) end a
       from parcel p join reference_feature r on r.version_id = any(?::bigint[]) and r.geom && p.geom and st_intersects(p.geom, r.geom)
       where ${fp.sql}
       group by p.id, r.version_id, r.class, p.area_ha
     ) x where a > 0`,
    [versionIds, ...fp.args],
  );
  if (bulk) await analyzeAfterBulkWrite(db, 'parcel_overlay');
  await db.raw(
    `update parcel_overlay_run r set covered_share = least(1, s.total)
     from (select parcel_id, layer_version_id, sum(share) total from parcel_overlay where layer_version_id = any(?::bigint[]) group by 1, 2) s
     where r.parcel_id = s.parcel_id and r.layer_version_id = s.layer_version_id`,
    [versionIds],
  );
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
