/**
 * What keeps the register consistent when saves race (server-only): one transaction-scoped
 * advisory lock serialises every write of parcel boundaries, and the overlap measures
 * (ST_Intersection, ST_Area on geography, GiST-indexed) that the checks before and inside a
 * save use.
 */
import type { MultiPolygon } from 'geojson';
import type { Db } from './client';

/** Held until the transaction ends; every parcel insert or boundary change takes it first. */
export async function lockParcelRegister(db: Db): Promise<void> {
  await db.raw("select pg_advisory_xact_lock(hashtext('swardkeep:parcel-register'))");
}

export type Measure = { areaAM2: number; areaBM2: number; overlapM2: number };
const measure = (a: string, b: string) =>
  `st_area(${a}::geography) as "areaAM2", st_area(${b}::geography) as "areaBM2", st_area(st_intersection(${a}, ${b})::geography) as "overlapM2"`;
// Interiors meet: DE-9IM interior/interior not empty. One relate instead of ST_Intersects and ST_Touches
// (the same pairs; about a quarter faster on a 20,000-parcel file).
const interiorsMeet = (a: string, b: string) => `${a} && ${b} and st_relate(${a}, ${b}, 'T********')`;

/** Pairs of features of one staged upload whose interiors meet (a before b in the file). */
export async function stagedPairs(
  db: Db,
  stagingId: string,
): Promise<(Measure & { a: number; b: number; refA: string | null; refB: string | null })[]> {
  const r = await db.raw(
    `select a.idx as a, b.idx as b, a.reference as "refA", b.reference as "refB", ${measure('a.geom', 'b.geom')}
     from upload_staging_feature a join upload_staging_feature b on b.staging_id = a.staging_id and b.idx > a.idx and ${interiorsMeet('a.geom', 'b.geom')}
     where a.staging_id = ? and a.geom is not null and b.geom is not null
     order by b.idx, a.idx`,
    [stagingId],
  );
  return r.rows;
}

/** Staged features (not rejected) whose interiors meet a parcel of the register. */
export async function stagedRegisterPairs(
  db: Db,
  stagingId: string,
): Promise<(Measure & { idx: number; reference: string | null; parcel: string })[]> {
  const r = await db.raw(
    `select f.idx, f.reference, p.reference as parcel, ${measure('f.geom', 'p.geom')}
     from upload_staging_feature f join parcel p on ${interiorsMeet('f.geom', 'p.geom')}
     where f.staging_id = ? and f.status <> 'rejected' and f.geom is not null
     order by f.idx, p.reference`,
    [stagingId],
  );
  return r.rows;
}

/** Staged features (not rejected) whose reference key, or exact boundary, is already in the register. */
export async function stagedRegisterTwins(
  db: Db,
  stagingId: string,
): Promise<{ idx: number; reference: string | null; parcel: string; why: 'reference' | 'boundary' }[]> {
  const r = await db.raw(
    `select f.idx, f.reference, p.reference as parcel, 'reference' as why from upload_staging_feature f join ` +
      `parcel p on p.reference_key = f.fields->>'referenceKey'
     where f.staging_id = ? and f.status <> 'rejected'
     union all
     select f.idx, f.reference, p.reference, 'boundary' from upload_staging_feature f join parcel p on p.geom && f.geom and st_equals(p.geom, f.geom)
     where f.staging_id = ? and f.status <> 'rejected'
     order by 1`,
    [stagingId, stagingId],
  );
  return r.rows;
}

/** Parcels of the register whose interiors meet `geometry` (EPSG:4326), except one. */
export async function geometryRegisterPairs(
  db: Db,
  geometry: MultiPolygon,
  exceptId?: number,
): Promise<(Measure & { parcel: string })[]> {
  const r = await db.raw(
    `with g as (select st_geomfromgeojson(?) as geom)
     select p.reference as parcel, ${measure('g.geom', 'p.geom')}
     from g join parcel p on ${interiorsMeet('g.geom', 'p.geom')}
     where p.id <> ? order by p.reference`,
    [JSON.stringify(geometry), exceptId ?? 0],
  );
  return r.rows;
}

/** Appends issues to staged features; `reject` marks them rejected. */
export async function addStagedIssues(
  db: Db,
  stagingId: string,
  items: { idx: number; issues: unknown[]; reject: boolean }[],
): Promise<void> {
  if (items.length === 0) return;
  await db.raw(
    `update upload_staging_feature f set issues = f.issues || x.issues, status = case when x.reject then 'rejected' else f.status end
     from jsonb_to_recordset(?::jsonb) as x(idx int, issues jsonb, reject boolean)
     where f.staging_id = ? and f.idx = x.idx`,
    [JSON.stringify(items), stagingId],
  );
}
