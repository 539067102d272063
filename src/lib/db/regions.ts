/**
 * Accounting regions (districts): each parcel belongs to the region of the current `region`
 * layer version in which it has its largest share. Figures as of a date come from the land-use
 * history (src/lib/gis/region-figures.ts); reference ratios are computed the same way for the
 * reference date when the history covers it, else entered by an admin with their source.
 */
import type { LandUseEvent } from '../gis/land-use-history';
import { regionFigures, historyCovers, type RegionFigures, type RegionParcel } from '../gis/region-figures';
import { classLabel } from '../gis/reference-kinds';
import type { Db } from './client';
import { getSetting } from './factor-sets';
import { getGisSettings } from './gis-settings';

/** Reference year of the ratio rule (app_setting); GAEC 1 of Reg. (EU) 2021/2115 uses 2018. */
export const REFERENCE_YEAR_KEY = 'region.reference-year';
export const DEFAULT_REFERENCE_YEAR = 2018;

export type RegionStat = RegionFigures;
export type ReferenceRatio = {
  key: string;
  referenceYear: number;
  ratio: number;
  origin: 'computed' | 'entered';
  /** Where the figure comes from, in words for the screen. */
  source: string;
  enteredBy: string | null;
  enteredAt: string | null;
};

async function currentRegionVersion(conn: Db): Promise<{ id: number; version: number } | null> {
  return (
    (await conn('reference_layer_version')
      .where({ kind: 'region', status: 'published' })
      .orderBy('version', 'desc')
      .first('id', 'version')) ?? null
  );
}

export async function regionList(
  conn: Db,
): Promise<{ layerVersion: number | null; regions: { key: string; label: string }[] }> {
  const v = await currentRegionVersion(conn);
  if (!v) return { layerVersion: null, regions: [] };
  return { layerVersion: v.version, regions: await regionsOfVersion(conn, v.id) };
}

/** The regions (key and name) of one region layer version. */
export async function regionsOfVersion(conn: Db, versionId: number): Promise<{ key: string; label: string }[]> {
  const rows: { key: string; label: string | null }[] = await conn('reference_feature')
    .where({ version_id: versionId })
    .groupBy('class')
    .orderBy('class')
    .select('class as key', conn.raw('min(label) as label'));
  return rows.map((r) => ({ key: r.key, label: r.label ?? classLabel(r.key) }));
}

/** Per region: agricultural area and permanent grassland (ha) as of `asOf` ("YYYY-MM-DD"). */
export async function regionStats(conn: Db, asOf: string, keys?: string[]): Promise<RegionStat[]> {
  return (await regionStatsAt(conn, [asOf], keys))[0] ?? [];
}

/**
 * `regionStats` for several dates from one read of the regions' parcels and their land-use
 * events (up to the latest date): one list of figures per date, in the order given.
 */
export async function regionStatsAt(conn: Db, dates: string[], keys?: string[]): Promise<RegionStat[][]> {
  const v = await currentRegionVersion(conn);
  if (!v || !dates.length) return dates.map(() => []);
  const regions = await regionsOfVersion(conn, v.id);
  const wanted = keys ? regions.filter((r) => keys.includes(r.key)) : regions;
  if (!wanted.length) return dates.map(() => []);
  const latest = dates.reduce((a, b) => (b > a ? b : a));
  const assigned = await conn.raw(
    `with a as (select distinct on (o.parcel_id) o.parcel_id, o.class from parcel_overlay o where ` +
      `o.layer_version_id = ? order by o.parcel_id, o.share desc, o.class)
     select a.class as region_key, p.area_ha,
            coalesce((select json_agg(json_build_object('date', to_char(e.event_date, 'YYYY-MM-DD'), 'kind', ` +
      `e.kind, 'value', e.value, 'cultivation', e.cultivation) order by e.event_date, e.id)
                      from land_use_event e where e.parcel_id = p.id and e.event_date <= ?::date), '[]') as events
     from a join parcel p on p.id = a.parcel_id where a.class = any(?::text[])`,
    [v.id, latest, wanted.map((r) => r.key)],
  );
  const s = await getGisSettings(conn);
  const windows = {
    permanentGrasslandYears: s['land-use.permanent-grassland-years'],
    uncultivatedYears: s['land-use.uncultivated-years'],
    tillageEndsGrassland: s['land-use.tillage-ends-grassland'],
  };
  const parcels: RegionParcel[] = assigned.rows.map(
    (r: { region_key: string; area_ha: number; events: LandUseEvent[] }) => ({
      regionKey: r.region_key,
      areaHa: Number(r.area_ha),
      events: r.events,
    }),
  );
  return dates.map((asOf) =>
    regionFigures(
      wanted,
      asOf === latest ? parcels : parcels.map((p) => ({ ...p, events: p.events.filter((e) => e.date <= asOf) })),
      asOf,
      windows,
    ),
  );
}

export async function referenceYear(conn: Db): Promise<number> {
  return (await getSetting<number>(conn, REFERENCE_YEAR_KEY)) ?? DEFAULT_REFERENCE_YEAR;
}

/** The date the reference ratio is computed for: the last day of the reference year. */
export const referenceDate = (year: number) => `${year}-12-31`;

/**
 * The region's reference ratio: computed from the history for the reference date when the
 * history covers it, else the newest ratio an admin entered (with its source), else null.
 */
export async function referenceRatio(conn: Db, key: string): Promise<ReferenceRatio | null> {
  return (await referenceRatios(conn, [key])).get(key) ?? null;
}

/** `referenceRatio` for several regions from one read of the history (a key with no ratio is absent). */
export async function referenceRatios(conn: Db, keys: string[]): Promise<Map<string, ReferenceRatio>> {
  if (!keys.length) return new Map();
  const year = await referenceYear(conn);
  const [figs] = await regionStatsAt(conn, [referenceDate(year)], keys);
  return ratiosFrom(conn, year, figs ?? [], keys);
}

/**
 * Figures as of `asOf` and reference ratios of the same regions from one read of the history
 * (what an assessment, the screening map and the dashboard need together).
 */
export async function regionStatsWithReference(
  conn: Db,
  asOf: string,
  keys?: string[],
): Promise<{ stats: RegionStat[]; refs: Map<string, ReferenceRatio> }> {
  const year = await referenceYear(conn);
  const [stats = [], figs = []] = await regionStatsAt(conn, [asOf, referenceDate(year)], keys);
  return {
    stats,
    refs: await ratiosFrom(
      conn,
      year,
      figs,
      stats.map((s) => s.key),
    ),
  };
}

async function ratiosFrom(
  conn: Db,
  year: number,
  figs: RegionStat[],
  keys: string[],
): Promise<Map<string, ReferenceRatio>> {
  const out = new Map<string, ReferenceRatio>();
  if (!keys.length) return out;
  for (const fig of figs) {
    if (!keys.includes(fig.key)) continue;
    if (historyCovers(fig)) {
      out.set(fig.key, {
        key: fig.key,
        referenceYear: year,
        ratio: fig.permanentGrasslandHa / fig.agriculturalHa,
        origin: 'computed',
        source: `Computed from the recorded land-use history as of ${referenceDate(year)}`,
        enteredBy: null,
        enteredAt: null,
      });
    }
  }
  const missing = keys.filter((k) => !out.has(k));
  if (missing.length) {
    const rows = await conn('region_reference_ratio as r')
      .leftJoin('user as u', 'u.id', 'r.entered_by')
      .whereIn('r.region_key', missing)
      .distinctOn('r.region_key')
      .orderBy([{ column: 'r.region_key' }, { column: 'r.id', order: 'desc' }])
      .select('r.region_key', 'r.reference_year', 'r.ratio', 'r.source', 'u.name', 'r.entered_at');
    for (const row of rows) {
      out.set(row.region_key, {
        key: row.region_key,
        referenceYear: row.reference_year,
        ratio: Number(row.ratio),
        origin: 'entered',
        source: row.source,
        enteredBy: row.name ?? null,
        enteredAt: row.entered_at.toISOString(),
      });
    }
  }
  return out;
}

export async function insertReferenceRatio(
  conn: Db,
  r: { key: string; referenceYear: number; ratio: number; source: string; by: string },
): Promise<number> {
  const [row] = await conn('region_reference_ratio')
    .insert({ region_key: r.key, reference_year: r.referenceYear, ratio: r.ratio, source: r.source, entered_by: r.by })
    .returning('id');
  return Number(row.id);
}

export async function listEnteredRatios(
  conn: Db,
  key: string,
): Promise<{ referenceYear: number; ratio: number; source: string; enteredBy: string | null; enteredAt: string }[]> {
  const rows = await conn('region_reference_ratio as r')
    .leftJoin('user as u', 'u.id', 'r.entered_by')
    .where('r.region_key', key)
    .orderBy('r.id', 'desc')
    .select('r.reference_year', 'r.ratio', 'r.source', 'u.name', 'r.entered_at');
  return rows.map((r) => ({
    referenceYear: r.reference_year,
    ratio: Number(r.ratio),
    source: r.source,
    enteredBy: r.name ?? null,
    enteredAt: r.entered_at.toISOString(),
  }));
}
