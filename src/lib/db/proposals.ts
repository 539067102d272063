/** SQL of the proposal aggregate: proposals, their parcels (whole or a drawn part), state events, attachments. */
import type { Knex } from 'knex';
import type { MultiPolygon } from 'geojson';
import type { LandUseState } from '../carbon';
import type { ProposalState } from '../proposals/states';
import { PROPOSAL_SETTING_KEYS, readProposalSettings, type ProposalSettings } from '../proposals/settings';
import type { Db } from './client';

export type ProposalRow = {
  id: number;
  reference: string;
  title: string;
  description: string;
  start_year: number;
  proposed: LandUseState;
  state: ProposalState;
  applicant_name: string;
  applicant_contact: string;
  applicant_interest: 'owner' | 'tenant' | 'agent';
  version: number;
  submitted_at: Date | null;
  decision_due: string | null;
  created_by: string | null;
  created_by_name: string | null;
  created_at: Date;
  updated_at: Date;
};

const DETAIL_COLUMNS = `p.*, to_char(p.decision_due, 'YYYY-MM-DD') as decision_due, u.name as created_by_name`;

export async function getProposal(db: Db, id: number, opts: { lock?: boolean } = {}): Promise<ProposalRow | null> {
  const r = await db.raw(
    `select ${DETAIL_COLUMNS} from proposal p left join "user" u on u.id = p.created_by where p.id = ? ${opts.lock ? 'for update of p' : ''}`,
    [id],
  );
  return r.rows[0] ?? null;
}

export async function nextReference(db: Db, year: number): Promise<string> {
  const r = await db.raw("select nextval('proposal_reference_seq')::int as n");
  return `P-${year}-${String(r.rows[0].n).padStart(4, '0')}`;
}

export type ProposalInsert = {
  reference: string;
  title: string;
  description: string;
  startYear: number;
  proposed: LandUseState;
  applicant: { name: string; contact: string; interest: string };
  by: string;
};

export async function insertProposal(db: Db, p: ProposalInsert): Promise<number> {
  const [row] = await db('proposal')
    .insert({
      reference: p.reference,
      title: p.title,
      description: p.description,
      start_year: p.startYear,
      proposed: JSON.stringify(p.proposed),
      applicant_name: p.applicant.name,
      applicant_contact: p.applicant.contact,
      applicant_interest: p.applicant.interest,
      created_by: p.by,
      updated_by: p.by,
    })
    .returning('id');
  return Number(row.id);
}

export async function updateProposalFields(
  db: Db,
  id: number,
  fields: Partial<Omit<ProposalInsert, 'reference' | 'by'>>,
  by: string,
): Promise<number> {
  const set: Record<string, unknown> = { updated_by: by, updated_at: db.fn.now(), version: db.raw('version + 1') };
  if (fields.title !== undefined) set.title = fields.title;
  if (fields.description !== undefined) set.description = fields.description;
  if (fields.startYear !== undefined) set.start_year = fields.startYear;
  if (fields.proposed !== undefined) set.proposed = JSON.stringify(fields.proposed);
  if (fields.applicant !== undefined)
    Object.assign(set, {
      applicant_name: fields.applicant.name,
      applicant_contact: fields.applicant.contact,
      applicant_interest: fields.applicant.interest,
    });
  const [row] = await db('proposal').where({ id }).update(set).returning('version');
  return Number(row.version);
}

export async function setState(
  db: Db,
  id: number,
  p: {
    from: ProposalState;
    to: ProposalState;
    reason: string | null;
    by: string;
    submittedAt?: boolean;
    decisionDays?: number;
  },
): Promise<number> {
  const set: Record<string, unknown> = {
    state: p.to,
    updated_by: p.by,
    updated_at: db.fn.now(),
    version: db.raw('version + 1'),
  };
  if (p.submittedAt) {
    set.submitted_at = db.fn.now();
    set.decision_due = db.raw('current_date + ?::int', [p.decisionDays ?? 35]);
  }
  const [row] = await db('proposal').where({ id }).update(set).returning('version');
  await db('proposal_event').insert({
    proposal_id: id,
    from_state: p.from,
    to_state: p.to,
    reason: p.reason,
    by: p.by,
  });
  return Number(row.version);
}

export async function insertCreatedEvent(db: Db, id: number, by: string): Promise<void> {
  await db('proposal_event').insert({ proposal_id: id, from_state: null, to_state: 'draft', reason: null, by });
}

/** Parcels that do not exist, by id. */
export async function missingParcels(db: Db, ids: number[]): Promise<number[]> {
  const r = await db.raw(
    'select i from unnest(?::bigint[]) i where not exists (select 1 from parcel p where p.id = i)',
    [ids],
  );
  return r.rows.map((x: { i: string }) => Number(x.i));
}

/**
 * Replaces the parcels of a proposal. A part must lie inside its parcel (0.5 m tolerance for
 * digitising along the edge, measured on the ellipsoid); returns the references of parts that do not.
 */
export async function replaceParcels(
  db: Db,
  proposalId: number,
  parcels: { parcelId: number; part: MultiPolygon | null }[],
): Promise<{ outside: string[] }> {
  await db('proposal_parcel').where({ proposal_id: proposalId }).delete();
  const rows = parcels.map((p, i) => ({ id: p.parcelId, pos: i, part: p.part ? JSON.stringify(p.part) : null }));
  await db.raw(
    `insert into proposal_parcel (proposal_id, parcel_id, position, part, area_ha)
     select ?, p.id, r.pos, g.part, case when g.part is null then p.area_ha else st_area(g.part::geography) / 10000 end
     from jsonb_to_recordset(?::jsonb) r(id bigint, pos int, part text)
     join parcel p on p.id = r.id
     cross join lateral (select case when r.part is null then null else st_multi(st_setsrid(st_geomfromgeojson(r.part), 4326)) end part) g`,
    [proposalId, JSON.stringify(rows)],
  );
  const outside = await db.raw(
    `select p.reference from proposal_parcel pp join parcel p on p.id = pp.parcel_id
     where pp.proposal_id = ? and pp.part is not null
       and not st_coveredby(pp.part, st_buffer(p.geom::geography, 0.5)::geometry)`,
    [proposalId],
  );
  return { outside: outside.rows.map((r: { reference: string }) => r.reference) };
}

export type ProposalParcelRow = {
  parcel_id: number;
  reference: string;
  name: string | null;
  owner_ref: string | null;
  area_ha: number;
  parcel_area_ha: number;
  part: MultiPolygon | null;
  geometry: MultiPolygon;
  land_use: string | null;
  management: string | null;
};

export async function listParcels(db: Db, proposalId: number): Promise<ProposalParcelRow[]> {
  const r = await db.raw(
    `select pp.parcel_id::int as parcel_id, p.reference, p.name, p.owner_ref, pp.area_ha, p.area_ha as parcel_area_ha, p.land_use, p.management,
            st_asgeojson(pp.part, 7)::json as part, st_asgeojson(p.geom, 7)::json as geometry
     from proposal_parcel pp join parcel p on p.id = pp.parcel_id where pp.proposal_id = ? order by pp.position`,
    [proposalId],
  );
  return r.rows;
}

export async function listEvents(db: Db, proposalId: number) {
  const r = await db.raw(
    `select e.from_state, e.to_state, e.reason, u.name as by_name, e.at from proposal_event e left join "user" u ` +
      `on u.id = e.by where e.proposal_id = ? order by e.id`,
    [proposalId],
  );
  return r.rows as {
    from_state: string | null;
    to_state: string;
    reason: string | null;
    by_name: string | null;
    at: Date;
  }[];
}

export type ListFilter = {
  state?: ProposalState;
  parcel?: string;
  risk?: number;
  q?: string;
  sort: string;
  dir: 'asc' | 'desc';
  page: number;
  pageSize: number;
};

const SORTS: Record<string, string> = {
  reference: 'p.id',
  title: 'lower(p.title)',
  state: 'p.state',
  updated: 'p.updated_at',
  deadline: 'p.decision_due',
  risk: 'a.grade_level',
  co2e: 'a.co2e_total',
  area: 'area_ha',
};

export async function listProposals(db: Db, f: ListFilter) {
  const where: string[] = ['true'];
  const args: Knex.Value[] = [];
  if (f.state) where.push('p.state = ?') && args.push(f.state);
  if (f.parcel)
    where.push(
      'exists (select 1 from proposal_parcel x join parcel y on y.id = x.parcel_id where x.proposal_id = p.id and lower(y.reference) = lower(?))',
    ) && args.push(f.parcel);
  if (f.risk) where.push('a.grade_level = ?') && args.push(f.risk);
  if (f.q)
    where.push('(p.reference ilike ? or p.title ilike ?)') &&
      args.push(`%${f.q.replace(/[%_\\]/g, '\\$&')}%`, `%${f.q.replace(/[%_\\]/g, '\\$&')}%`);
  const from = `from proposal p
    left join lateral (select grade_level, grade_label, co2e_total from assessment where proposal_id = p.id order by number desc limit 1) a on true
    left join lateral (select count(*)::int as parcel_count, coalesce(sum(pp.area_ha), 0) as area_ha,
                              (array_agg(pr.reference order by pp.position))[1:5] as refs
                       from proposal_parcel pp join parcel pr on pr.id = pp.parcel_id where pp.proposal_id = p.id) c on true
    where ${where.join(' and ')}`;
  const order = `${SORTS[f.sort] ?? 'p.updated_at'} ${f.dir === 'asc' ? 'asc' : 'desc'} nulls last, p.id desc`;
  const [rows, total] = await Promise.all([
    db.raw(
      `select p.id::int as id, p.reference, p.title, p.state, p.start_year, p.submitted_at, to_char(p.decision_due, 'YYYY-MM-DD') as decision_due, p.updated_at,
              a.grade_level, a.grade_label, a.co2e_total, c.parcel_count, c.area_ha, c.refs
       ${from} order by ${order} limit ? offset ?`,
      [...args, f.pageSize, (f.page - 1) * f.pageSize],
    ),
    db.raw(`select count(*)::int as n ${from}`, args),
  ]);
  return { rows: rows.rows as ListRow[], total: Number(total.rows[0].n) };
}

export type ListRow = {
  id: number;
  reference: string;
  title: string;
  state: ProposalState;
  start_year: number;
  submitted_at: Date | null;
  decision_due: string | null;
  updated_at: Date;
  grade_level: number | null;
  grade_label: string | null;
  co2e_total: number | null;
  parcel_count: number;
  area_ha: number;
  refs: string[] | null;
};

export type AttachmentRow = {
  id: string;
  file_name: string;
  media_type: string;
  size_bytes: number;
  sha256: string;
  uploaded_by_name: string | null;
  uploaded_at: Date;
};

export async function listAttachments(db: Db, proposalId: number): Promise<AttachmentRow[]> {
  const r = await db.raw(
    `select a.id, a.file_name, a.media_type, a.size_bytes, a.sha256, u.name as uploaded_by_name, a.uploaded_at
     from proposal_attachment a left join "user" u on u.id = a.uploaded_by where a.proposal_id = ? order by a.uploaded_at, a.id`,
    [proposalId],
  );
  return r.rows;
}

export async function insertAttachment(
  db: Db,
  a: {
    id: string;
    proposalId: number;
    fileName: string;
    mediaType: string;
    bytes: Uint8Array;
    sha256: string;
    by: string;
  },
): Promise<void> {
  await db('proposal_attachment').insert({
    id: a.id,
    proposal_id: a.proposalId,
    file_name: a.fileName,
    media_type: a.mediaType,
    size_bytes: a.bytes.length,
    sha256: a.sha256,
    bytes: Buffer.from(a.bytes),
    uploaded_by: a.by,
  });
}

export async function getAttachment(
  db: Db,
  proposalId: number,
  id: string,
): Promise<{ file_name: string; media_type: string; bytes: Buffer; sha256: string } | null> {
  return (
    (await db('proposal_attachment')
      .select('file_name', 'media_type', 'bytes', 'sha256')
      .where({ proposal_id: proposalId, id })
      .first()) ?? null
  );
}

/** Users holding a role (active ones), for notifications. */
export async function usersWithRole(db: Db, role: string): Promise<{ id: string; name: string; email: string }[]> {
  const r = await db.raw(
    `select id, name, email from "user" where ? = any(string_to_array(role, ',')) and coalesce(banned, false) = false order by email`,
    [role],
  );
  return r.rows;
}

export async function getProposalSettings(db: Db): Promise<ProposalSettings> {
  return readProposalSettings(await db('app_setting').select('key', 'value').whereIn('key', PROPOSAL_SETTING_KEYS));
}
