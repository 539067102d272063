/** SQL of the screening map: the inputs of every parcel in one pass, and the results of a run. */
import type { Knex } from 'knex';
import type { ScreeningResult } from '../proposals/screening';
import { analyzeAfterBulkWrite } from './bulk';
import type { Db } from './client';

export type ScreeningInputRow = {
  id: number;
  reference: string;
  area_ha: number;
  owner_ref: string | null;
  climate: string | null;
  climate_cover: number | null;
  soils: { class: string; share: number }[];
  soil_cover: number | null;
  sensitive: number;
  never_tilled: number;
  slope: { class: string; share: number }[];
  region: string | null;
};

/** Every parcel with its overlay against the current published layers, summarised per kind. */
export async function screeningInputs(db: Db): Promise<ScreeningInputRow[]> {
  // Aggregated per parcel in one pass each (hash joins), never a subquery per parcel.
  const r = await db.raw(
    `with cur as (select distinct on (kind) id, kind from reference_layer_version where status = 'published' order by kind, version desc),
     agg as (
       select o.parcel_id,
              (array_agg(o.class order by o.share desc, o.class) filter (where cur.kind = 'climate'))[1] as climate,
              coalesce(json_agg(json_build_object('class', o.class, 'share', o.share) order by o.class) filter (where cur.kind = 'soil'), '[]') as soils,
              least(1, coalesce(sum(o.share) filter (where cur.kind = 'sensitive'), 0))::float8 as sensitive,
              least(1, coalesce(sum(o.share) filter (where cur.kind = 'never-tilled'), 0))::float8 as never_tilled,
              coalesce(json_agg(json_build_object('class', o.class, 'share', o.share) order by o.class) filter (where cur.kind = 'slope'), '[]') as slope,
              (array_agg(o.class order by o.share desc, o.class) filter (where cur.kind = 'region'))[1] as region
       from parcel_overlay o join cur on cur.id = o.layer_version_id group by o.parcel_id),
     runs as (
       select run.parcel_id, max(run.covered_share) filter (where cur.kind = 'climate') as climate_cover, ` +
      `max(run.covered_share) filter (where cur.kind = 'soil') as soil_cover
       from parcel_overlay_run run join cur on cur.id = run.layer_version_id where cur.kind in ('climate', 'soil') group by run.parcel_id)
     select p.id::int as id, p.reference, p.area_ha, p.owner_ref, a.climate, r.climate_cover, coalesce(a.soils, '[]') as soils, r.soil_cover,
            coalesce(a.sensitive, 0) as sensitive, coalesce(a.never_tilled, 0) as never_tilled, coalesce(a.slope, '[]') as slope, a.region
     from parcel p left join agg a on a.parcel_id = p.id left join runs r on r.parcel_id = p.id order by p.id`,
  );
  return r.rows;
}

export async function allEvents(db: Db) {
  const r = await db.raw(
    `select parcel_id::int as parcel_id, to_char(event_date, 'YYYY-MM-DD') as date, kind, value, cultivation from ` +
      `land_use_event order by parcel_id, event_date, id`,
  );
  return r.rows as {
    parcel_id: number;
    date: string;
    kind: 'land-use' | 'management' | 'tillage' | 'reseeding';
    value: string | null;
    cultivation: boolean;
  }[];
}

/** Permanent grassland converted per holding by proposals (submitted or later, not withdrawn) within the window. */
export async function proposalsByHolding(db: Db, windowYears: number) {
  const r = await db.raw(
    `select pr.owner_ref, sum(pp.area_ha)::float8 as ha, array_agg(distinct p.reference) as refs
     from proposal p join proposal_parcel pp on pp.proposal_id = p.id join parcel pr on pr.id = pp.parcel_id
     where pr.owner_ref is not null and p.state in ('submitted', 'in-assessment', 'assessed', 'on-agenda') and p.proposed->>'landUse' = 'cropland'
       and p.submitted_at >= now() - make_interval(years => ?)
     group by pr.owner_ref`,
    [windowYears],
  );
  return r.rows as { owner_ref: string; ha: number; refs: string[] }[];
}

export async function insertRun(
  db: Db,
  run: {
    factorSet: { id: string; version: number };
    ruleSet: { id: string; version: number };
    layers: Record<string, number>;
    mapVersion: number;
    screened: number;
    ms: number;
    reason: string;
    by: string | null;
  },
): Promise<number> {
  const [row] = await db('screening_run')
    .insert({
      factor_set_id: run.factorSet.id,
      factor_set_version: run.factorSet.version,
      rule_set_id: run.ruleSet.id,
      rule_set_version: run.ruleSet.version,
      layer_versions: JSON.stringify(run.layers),
      map_data_version: run.mapVersion,
      parcels_screened: run.screened,
      duration_ms: run.ms,
      reason: run.reason,
      by: run.by,
    })
    .returning('id');
  return Number(row.id);
}

/** Replaces every result with this run's (one statement per 5,000 rows). */
export async function replaceResults(db: Db, runId: number, results: ScreeningResult[]): Promise<void> {
  await db('screening_result').delete();
  for (let at = 0; at < results.length; at += 5000) {
    const rows = results.slice(at, at + 5000).map((r) => ({
      p: r.parcelId,
      l: r.level,
      lb: r.label,
      c: r.co2eTotal,
      h: r.co2eHigh,
      s: r.socLossPerHa,
      r: r.rules,
      pr: r.problem,
    }));
    await db.raw(
      `insert into screening_result (parcel_id, run_id, level, label, co2e_total, co2e_high, soc_loss_per_ha, rules, problem)
       select x.p, ?, x.l, x.lb, x.c, x.h, x.s, array(select jsonb_array_elements_text(x.r)), x.pr
       from jsonb_to_recordset(?::jsonb) x(p bigint, l int, lb text, c float8, h float8, s float8, r jsonb, pr text)`,
      [runId, JSON.stringify(rows)],
    );
  }
  await analyzeAfterBulkWrite(db, 'screening_result');
}

export async function latestRun(db: Db) {
  return (
    (await db('screening_run as r')
      .leftJoin('user as u', 'u.id', 'r.by')
      .select('r.*', 'u.name as by_name')
      .orderBy('r.id', 'desc')
      .first()) ?? null
  );
}

const SORTS: Record<string, string> = {
  reference: 'p.reference',
  area: 'p.area_ha',
  level: 's.level',
  co2e: 's.co2e_total',
  high: 's.co2e_high',
  loss: 's.soc_loss_per_ha',
};

export async function listResults(
  db: Db,
  q: { level?: number; region?: string; sort: string; dir: 'asc' | 'desc'; page: number; pageSize: number },
) {
  const where: string[] = ['true'];
  const args: Knex.Value[] = [];
  if (q.level) where.push('s.level = ?') && args.push(q.level);
  if (q.region) {
    where.push(
      `exists (select 1 from parcel_overlay o join reference_layer_version v on v.id = o.layer_version_id and ` +
        `v.kind = 'region' and v.status = 'published' where o.parcel_id = p.id and o.class = ? and o.share >= 0.5)`,
    );
    args.push(q.region);
  }
  const from = `from screening_result s join parcel p on p.id = s.parcel_id where ${where.join(' and ')}`;
  const [rows, total] = await Promise.all([
    db.raw(
      `select p.id::int as parcel_id, p.reference, p.area_ha, s.level, s.label, s.co2e_total, s.co2e_high, s.soc_loss_per_ha, s.rules, s.problem ${from}
            order by ${SORTS[q.sort] ?? 's.level'} ${q.dir === 'asc' ? 'asc' : 'desc'} nulls last, p.reference limit ? offset ?`,
      [...args, q.pageSize, (q.page - 1) * q.pageSize],
    ),
    db.raw(`select count(*)::int as n ${from}`, args),
  ]);
  return { rows: rows.rows, total: Number(total.rows[0].n) };
}
