/**
 * Reprojection by PostGIS ST_Transform (PROJ with the EPSG database: from an authority code it
 * picks EPSG's own datum transformation, grid-based where the grid is installed). Used for
 * CRSs with a datum shift, where proj4's parameters from the shipped catalogue can be tens of
 * metres off; the rest stays with proj4 in src/lib/gis/ingest/to-wgs84.ts.
 */
import type { Position } from 'geojson';
import { needsDatumShift, type CrsDefinition } from '../gis/crs';
import { GisInputError } from '../gis/errors';
import { layerToWgs84 } from '../gis/ingest/to-wgs84';
import { forEachPosition, mapPositions } from '../gis/rings';
import type { RawFeature } from '../gis/types';
import type { Db } from './client';

const CHUNK = 50_000;

export async function postgisKnowsSrid(db: Db, srid: number): Promise<boolean> {
  return (await db.raw('select 1 from spatial_ref_sys where srid = ?', [srid])).rows.length > 0;
}

/** [lon, lat] of each [x, y] in EPSG:srid; non-finite input stays NaN. */
export async function transformPositions(
  db: Db,
  positions: Position[],
  srid: number,
  crsName: string,
): Promise<Position[]> {
  const out: Position[] = [];
  for (let at = 0; at < positions.length; at += CHUNK) {
    const chunk = positions
      .slice(at, at + CHUNK)
      .map((p) => (Number.isFinite(p[0]) && Number.isFinite(p[1]) ? [p[0], p[1]] : null));
    try {
      const r = await db.raw(
        `select case when p is null or jsonb_typeof(p) = 'null' then null else ` +
          `st_asbinary(st_transform(st_setsrid(st_makepoint((p->>0)::float8, (p->>1)::float8), ?), 4326)) end as g, i
         from jsonb_array_elements(?::jsonb) with ordinality as t(p, i) order by i`,
        [srid, JSON.stringify(chunk)],
      );
      for (const row of r.rows as { g: Buffer | null }[])
        out.push(row.g ? [row.g.readDoubleLE(5), row.g.readDoubleLE(13)] : [Number.NaN, Number.NaN]);
    } catch (error) {
      throw new GisInputError(
        'unknown-crs',
        `Some coordinates cannot be converted from "${crsName}" (EPSG:${srid}) to WGS 84: ${(error as Error).message}`,
        { cause: error },
      );
    }
  }
  return out;
}

/** True when PostGIS reprojects this CRS: a datum shift and an EPSG code PostGIS knows. */
export async function reprojectsInPostgis(db: Db, crs: CrsDefinition | null): Promise<boolean> {
  return (
    !!crs && crs.epsg !== null && crs.epsg !== 4326 && needsDatumShift(crs) && (await postgisKnowsSrid(db, crs.epsg))
  );
}

/** Converts a layer to EPSG:4326: by PostGIS for CRSs with a datum shift and an EPSG code PostGIS knows, else by proj4. */
export async function reprojectLayer(
  db: Db,
  features: RawFeature[],
  crs: CrsDefinition | null,
  layerName: string,
): Promise<RawFeature[]> {
  if (!crs || !(await reprojectsInPostgis(db, crs))) return layerToWgs84(features, crs, layerName);
  const positions: Position[] = [];
  for (const f of features) if (f.geometry) forEachPosition(f.geometry, (p) => positions.push(p));
  const lonLat = await transformPositions(db, positions, crs.epsg!, crs.name);
  let i = 0;
  return features.map((f) => (f.geometry ? { ...f, geometry: mapPositions(f.geometry, () => lonLat[i++]!) } : f));
}
