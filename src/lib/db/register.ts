/** SQL of the register: append under a lock, head, list with filters, one entry, batches for verify and exports. */
import type { Knex } from 'knex';
import { entryHash, GENESIS_HASH, type StoredEntry } from '../register/chain';
import type { RegisterContent } from '../register/content';
import type { Db } from './client';

/** One lock key for appends to the register, shared by every instance (pg_advisory_xact_lock). */
const APPEND_LOCK = 0x5257_4b01;

export type RegisterRow = StoredEntry & {
  supersedes_seq: number | null;
  created_at: Date;
  superseded_by: number | null;
};

export async function head(db: Db): Promise<{ seq: number; hash: string } | null> {
  const r = await db.raw('select seq, hash from register_entry order by seq desc limit 1');
  return r.rows[0] ? { seq: Number(r.rows[0].seq), hash: r.rows[0].hash } : null;
}

export type ListState = { head: { seq: number; hash: string } | null; regionVersionId: number | null };

/** The head and the current published region layer version, in one round trip (what a list answer depends on besides its query). */
export async function listState(db: Db): Promise<ListState> {
  const r = await db.raw(
    `select h.seq, h.hash,
            (select id from reference_layer_version where kind = 'region' and status = 'published' order by version desc limit 1) as region_version
     from (select 1) one left join lateral (select seq, hash from register_entry order by seq desc limit 1) h on true`,
  );
  const row = r.rows[0];
  return {
    head: row.seq === null ? null : { seq: Number(row.seq), hash: row.hash },
    regionVersionId: row.region_version === null ? null : Number(row.region_version),
  };
}

/** Appends an entry in the caller's transaction; the advisory lock makes concurrent appends queue, so the chain cannot fork. */
export async function appendEntry(trx: Db, content: RegisterContent): Promise<{ seq: number; hash: string }> {
  await trx.raw('select pg_advisory_xact_lock(?)', [APPEND_LOCK]);
  const last = await head(trx);
  const seq = (last?.seq ?? 0) + 1;
  const prevHash = last?.hash ?? GENESIS_HASH;
  const hash = entryHash(seq, prevHash, content);
  await trx('register_entry').insert({
    seq,
    prev_hash: prevHash,
    hash,
    content: JSON.stringify(content),
    supersedes_seq: content.supersedes,
  });
  return { seq, hash };
}

/** Entries in seq order after `afterSeq`, `limit` at a time (keyset paging for exports and single entries). */
export async function batchAfter(
  db: Db,
  afterSeq: number,
  limit: number,
  where = 'true',
  args: Knex.Value[] = [],
): Promise<RegisterRow[]> {
  const r = await db.raw(
    `select seq::float8 as seq, prev_hash, hash, content, supersedes_seq::float8 as supersedes_seq, created_at,
            (select min(s.seq)::float8 from register_entry s where s.supersedes_seq = e.seq) as superseded_by
     from register_entry e where seq > ? and ${where} order by seq limit ?`,
    [afterSeq, ...args, limit],
  );
  return r.rows;
}

/** One CSV row per entry, every column computed from the stored content (named as `CSV_COLUMNS`); nothing to parse in Node. */
export async function csvBatchAfter(
  db: Db,
  afterSeq: number,
  limit: number,
  where = 'true',
  args: Knex.Value[] = [],
): Promise<({ seq: number } & Record<string, string | number | null>)[]> {
  // jsonb_to_record reads the stored content once per row (each -> on the column itself would read the whole value again).
  const r = await db.raw(
    `select e.seq::float8 as seq, e.hash, c.kind, c.proposal->>'reference' as reference, c.proposal->>'title' as title,
            c.proposal->>'proposedUse' as proposed_use, c.outcome, c."decidedOn" as decided_on, c."effectiveDate" ` +
      `as effective_date, c."appealUntil" as appeal_until,
            (select string_agg(p->>'reference', ' ' order by o) from jsonb_array_elements(c.parcels) with ordinality x(p, o)) as parcels,
            c."areaHa" as area_ha, c.region, (c.risk->>'level')::int as risk_level, c.risk->>'label' as risk_label,
            (c.figures->>'co2eTotal')::float8 as co2e_t, (c.figures->>'co2eLow')::float8 as co2e_low_t, (c.figures->>'co2eHigh')::float8 as co2e_high_t,
            c.figures->>'gwp' as gwp, (c."factorSet"->>'id') || '@' || (c."factorSet"->>'version') as factor_set,
            (c."ruleSet"->>'id') || '@' || (c."ruleSet"->>'version') as rule_set, c.meeting->>'date' as meeting_date,
            (select string_agg(format('%s (due %s; checked by %s)', k->>'text', k->>'dueDate', k->>'checkedBy'), ' ` +
      `| ' order by o) from jsonb_array_elements(c.conditions) with ordinality y(k, o)) as conditions,
            c.reasons, e.supersedes_seq::float8 as supersedes_seq,
            (select min(s.seq)::float8 from register_entry s where s.supersedes_seq = e.seq) as superseded_by
     from register_entry e
     cross join lateral jsonb_to_record(e.content) as c(kind text, proposal jsonb, outcome text, "decidedOn" text, ` +
      `"effectiveDate" text, "appealUntil" text, parcels jsonb,
       "areaHa" float8, region text, risk jsonb, figures jsonb, "factorSet" jsonb, "ruleSet" jsonb, meeting jsonb, conditions jsonb, reasons text)
     where e.seq > ? and ${where} order by e.seq limit ?`,
    [afterSeq, ...args, limit],
  );
  return r.rows;
}

/** Only what verify needs (seq, hashes, content as text parsed once), in seq order. */
export async function chainBatch(db: Db, afterSeq: number, limit: number): Promise<StoredEntry[]> {
  const r = await db.raw(
    'select seq::float8 as seq, prev_hash, hash, content from register_entry where seq > ? order by seq limit ?',
    [afterSeq, limit],
  );
  return r.rows;
}

export async function getEntry(db: Db, seq: number): Promise<RegisterRow | null> {
  return (await batchAfter(db, seq - 1, 1, 'seq = ?', [seq]))[0] ?? null;
}

export type RegisterFilter = {
  outcome?: string;
  year?: number;
  risk?: number;
  areaMin?: number;
  areaMax?: number;
  region?: string;
  q?: string;
  current?: boolean;
};

/**
 * The WHERE clause of a filter over `register_entry e`. With `headSeq`, the register as it stood
 * when that entry was the newest (entries and corrections after it left out), so a list and its
 * count read one state of the register even while entries are appended.
 */
export function filterSql(f: RegisterFilter, headSeq?: number): { where: string; args: Knex.Value[] } {
  const where: string[] = ['true'];
  const args: Knex.Value[] = [];
  if (headSeq !== undefined) where.push('e.seq <= ?') && args.push(headSeq);
  if (f.outcome) where.push('e.outcome = ?') && args.push(f.outcome);
  if (f.year) where.push('e.decided_year = ?') && args.push(f.year);
  if (f.risk) where.push('e.risk_level = ?') && args.push(f.risk);
  if (f.areaMin !== undefined) where.push('e.area_ha >= ?') && args.push(f.areaMin);
  if (f.areaMax !== undefined) where.push('e.area_ha <= ?') && args.push(f.areaMax);
  if (f.region) where.push('e.region = ?') && args.push(f.region);
  if (f.q) {
    const like = `%${f.q.replace(/[%_\\]/g, '\\$&')}%`;
    where.push(
      "(e.reference ilike ? or e.content->'proposal'->>'title' ilike ? or exists (select 1 from " +
        "jsonb_array_elements(e.content->'parcels') p where p->>'reference' ilike ?))",
    );
    args.push(like, like, like);
  }
  if (f.current) {
    where.push(
      `not exists (select 1 from register_entry s where s.supersedes_seq = e.seq${headSeq !== undefined ? ' and s.seq <= ?' : ''})`,
    );
    if (headSeq !== undefined) args.push(headSeq);
  }
  return { where: where.join(' and '), args };
}

/**
 * Sort expressions, each served by an index ending in seq (migrations 20261202006000 and
 * 20261202010100). None is ever null (the content schema requires them), so a plain ORDER BY
 * (which an index scan gives in either direction) sorts as NULLS LAST would.
 */
const SORTS: Record<string, string> = {
  seq: 'e.seq',
  decided: "(e.content->>'decidedOn')",
  area: 'e.area_ha',
  risk: 'e.risk_level',
  co2e: "((e.content->'figures'->>'co2eTotal')::float8)",
  reference: 'e.reference',
};

export type ListRow = {
  seq: number;
  hash: string;
  supersedes_seq: number | null;
  superseded_by: number | null;
  created_at: Date;
  summary: Record<string, unknown>;
};

/** One page of the register as it stood at `headSeq`. */
export async function listEntries(
  db: Db,
  f: RegisterFilter & { sort: string; dir: 'asc' | 'desc'; page: number; pageSize: number },
  headSeq: number,
): Promise<ListRow[]> {
  const { where, args } = filterSql(f, headSeq);
  const dir = f.dir === 'asc' ? 'asc' : 'desc';
  const sort = SORTS[f.sort] ?? 'e.seq';
  const order = sort === 'e.seq' ? `e.seq ${dir}` : `${sort} ${dir}, e.seq ${dir}`;
  const r = await db.raw(
    `select e.seq::float8 as seq, e.hash, e.supersedes_seq::float8 as supersedes_seq, e.created_at,
            (select min(s.seq)::float8 from register_entry s where s.supersedes_seq = e.seq and s.seq <= ?) as superseded_by,
            e.content - 'parcels' || jsonb_build_object('parcelReferences', (select ` +
      `coalesce(jsonb_agg(p->'reference'), '[]') from jsonb_array_elements(e.content->'parcels') p)) as summary
     from register_entry e where ${where} order by ${order} limit ? offset ?`,
    [headSeq, ...args, f.pageSize, (f.page - 1) * f.pageSize],
  );
  return r.rows;
}

/** How many entries match a filter in the register as it stood at `headSeq`. */
export async function countEntries(db: Db, f: RegisterFilter, headSeq: number): Promise<number> {
  const { where, args } = filterSql(f, headSeq);
  const r = await db.raw(`select count(*)::int as n from register_entry e where ${where}`, args);
  return Number(r.rows[0].n);
}

/**
 * Approved CO2e committed in a budget year: current (not superseded) approvals of proposals starting
 * that year, less the gain credited for a compensation parcel; plus every reversed compensation whose
 * parcel was ploughed in that year (its credited gain comes back as emissions). Both parts read
 * partial indexes (register_entry_committed_idx, register_entry_reversal_idx), not the whole register.
 */
export async function committedCo2e(db: Db, year: number): Promise<number> {
  const current = 'e.seq not in (select s.supersedes_seq from register_entry s where s.supersedes_seq is not null)';
  const r = await db.raw(
    `select (select coalesce(sum(e.co2e_total - coalesce((e.content->'compensation'->>'creditedCo2e')::float8, 0)), 0)
               from register_entry e
              where e.outcome in ('approved', 'approved-with-conditions') and e.start_year = ?
                and coalesce(e.content->>'kind', '') <> 'compensation-reversed' and ${current})
          + (select coalesce(sum((e.content->'reverses'->>'creditedCo2e')::float8), 0)
               from register_entry e
              where e.content->>'kind' = 'compensation-reversed' and (e.content->'reverses'->>'budgetYear')::int = ? and ${current}) as t`,
    [year, year],
  );
  return Number(r.rows[0].t);
}

/**
 * One public vector tile of the register: layer "register" with the parcels of current entries
 * (not superseded), each with seq, outcome, decision year, risk level and the entry's area only —
 * never a holding, owner or applicant. Geometry from the entry's own stored boundaries (WGS 84).
 */
export async function registerTile(db: Db, z: number, x: number, y: number): Promise<Uint8Array> {
  const r = await db.raw(
    `with b as (select st_tileenvelope(?, ?, ?) as env),
     parts as (
       select e.seq::float8 as seq, e.outcome, e.decided_year as year, e.risk_level, e.area_ha,
              st_transform(st_setsrid(st_geomfromgeojson(p->'geometry'), 4326), 3857) as g
       from register_entry e cross join lateral jsonb_array_elements(e.content->'parcels') p
       where not exists (select 1 from register_entry s where s.supersedes_seq = e.seq)
     ),
     feats as (
       select st_asmvtgeom(parts.g, b.env, 4096, 64, true) as geom, seq, outcome, year, risk_level, area_ha
       from parts, b where parts.g && b.env
     )
     select coalesce((select st_asmvt(feats.*, 'register', 4096, 'geom') from feats where geom is not null), ''::bytea) as tile`,
    [z, x, y],
  );
  return new Uint8Array(r.rows[0].tile);
}

/**
 * How each member voted on the decision behind an entry (a correction or appeal outcome goes back
 * to the original decision): names and choices only, never comments. Empty when no vote is known.
 */
export async function memberVotes(db: Db, seq: number): Promise<{ name: string; choice: string }[]> {
  const r = await db.raw(
    `with recursive chain as (select seq, supersedes_seq from register_entry where seq = ?
       union all select e.seq, e.supersedes_seq from register_entry e join chain c on e.seq = c.supersedes_seq)
     select u.name, v.choice from chain c join board_decision d on d.register_seq = c.seq
     join meeting_vote v on v.item_id = d.item_id join "user" u on u.id = v.user_id
     where c.supersedes_seq is null order by u.name`,
    [seq],
  );
  return r.rows;
}
