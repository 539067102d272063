/** SQL of the assessment aggregate: versions of a proposal's assessment, and the overlay it reads. */
import type { OverlayRow } from '../gis/overlay-summary';
import type { ReferenceKind } from '../gis/reference-kinds';
import { unpackResult } from '../proposals/stored-result';
import type { Db } from './client';

export type AssessmentRow = {
  id: number;
  proposal_id: number;
  number: number;
  status: 'draft' | 'signed';
  version: number;
  inputs: Record<string, unknown>;
  result: Record<string, unknown>;
  factor_set_id: string;
  factor_set_version: number;
  rule_set_id: string | null;
  rule_set_version: number | null;
  grade_level: number | null;
  grade_label: string | null;
  co2e_total: number | null;
  findings: string | null;
  signed_by_name: string | null;
  signed_at: Date | null;
  created_by_name: string | null;
  created_at: Date;
  updated_at: Date;
};

const COLUMNS = `a.*, a.id::int as id, a.proposal_id::int as proposal_id, s.name as signed_by_name, c.name as created_by_name`;
const FROM = `from assessment a left join "user" s on s.id = a.signed_by left join "user" c on c.id = a.created_by`;

export async function getAssessment(db: Db, id: number, opts: { lock?: boolean } = {}): Promise<AssessmentRow | null> {
  const r = await db.raw(`select ${COLUMNS} ${FROM} where a.id = ? ${opts.lock ? 'for update of a' : ''}`, [id]);
  const row = r.rows[0];
  return row ? { ...row, result: unpackResult(row.result) } : null;
}

/** The draft of a proposal, locked; without its (large) inputs and result. */
export async function draftOf(
  db: Db,
  proposalId: number,
): Promise<{ id: number; number: number; version: number } | null> {
  const r = await db.raw(
    `select id::int as id, number, version from assessment where proposal_id = ? and status = 'draft' for update`,
    [proposalId],
  );
  return r.rows[0] ?? null;
}

/** Everything but the inputs and the result. */
export async function getAssessmentMeta(db: Db, id: number): Promise<Omit<AssessmentRow, 'inputs' | 'result'> | null> {
  const r = await db.raw(
    `select a.id::int as id, a.proposal_id::int as proposal_id, a.number, a.status, a.version, a.factor_set_id, ` +
      `a.factor_set_version, a.rule_set_id, a.rule_set_version,
            a.grade_level, a.grade_label, a.co2e_total, a.findings, a.signed_at, a.created_at, a.updated_at, ` +
      `s.name as signed_by_name, c.name as created_by_name ${FROM} where a.id = ?`,
    [id],
  );
  return r.rows[0] ?? null;
}

export async function listForProposal(db: Db, proposalId: number): Promise<Omit<AssessmentRow, 'inputs' | 'result'>[]> {
  const r = await db.raw(
    `select a.id::int as id, a.proposal_id::int as proposal_id, a.number, a.status, a.version, a.factor_set_id, ` +
      `a.factor_set_version, a.rule_set_id, a.rule_set_version,
            a.grade_level, a.grade_label, a.co2e_total, a.findings, a.signed_at, a.created_at, a.updated_at, ` +
      `s.name as signed_by_name, c.name as created_by_name ${FROM} where a.proposal_id = ? order by a.number desc`,
    [proposalId],
  );
  return r.rows;
}

export type AssessmentWrite = {
  /** Written as given: the service passes the stored form (`packResult`). */
  inputs: unknown;
  result: unknown;
  factorSet: { id: string; version: number };
  ruleSet: { id: string; version: number } | null;
  gradeLevel: number | null;
  gradeLabel: string | null;
  co2eTotal: number;
  by: string;
};

function columns(w: AssessmentWrite) {
  return {
    inputs: JSON.stringify(w.inputs),
    result: JSON.stringify(w.result),
    factor_set_id: w.factorSet.id,
    factor_set_version: w.factorSet.version,
    rule_set_id: w.ruleSet?.id ?? null,
    rule_set_version: w.ruleSet?.version ?? null,
    grade_level: w.gradeLevel,
    grade_label: w.gradeLabel,
    co2e_total: w.co2eTotal,
    updated_by: w.by,
  };
}

export async function insertAssessment(
  db: Db,
  proposalId: number,
  w: AssessmentWrite,
): Promise<{ id: number; number: number }> {
  const next = await db.raw('select coalesce(max(number), 0) + 1 as n from assessment where proposal_id = ?', [
    proposalId,
  ]);
  const number = Number(next.rows[0].n);
  const [row] = await db('assessment')
    .insert({ proposal_id: proposalId, number, status: 'draft', created_by: w.by, ...columns(w) })
    .returning('id');
  return { id: Number(row.id), number };
}

export async function updateDraft(db: Db, id: number, w: AssessmentWrite): Promise<number> {
  const [row] = await db('assessment')
    .where({ id, status: 'draft' })
    .update({ ...columns(w), version: db.raw('version + 1'), updated_at: db.fn.now() })
    .returning('version');
  return Number(row.version);
}

export async function saveFindings(db: Db, id: number, findings: string, by: string): Promise<number> {
  const [row] = await db('assessment')
    .where({ id, status: 'draft' })
    .update({ findings, updated_by: by, updated_at: db.fn.now(), version: db.raw('version + 1') })
    .returning('version');
  return Number(row.version);
}

export async function signOff(db: Db, id: number, findings: string, by: string): Promise<number> {
  const [row] = await db('assessment')
    .where({ id, status: 'draft' })
    .update({
      status: 'signed',
      findings,
      signed_by: by,
      signed_at: db.fn.now(),
      updated_by: by,
      updated_at: db.fn.now(),
      version: db.raw('version + 1'),
    })
    .returning('version');
  return Number(row.version);
}

export type ProposalOverlay = Map<number, OverlayRow[]>;

/**
 * The overlay of every parcel of a proposal with the current published layers, in one query:
 * the stored overlay for whole parcels; for a drawn part, the same intersection computed on the
 * part (ST_Intersection, union per class, ST_Area on geography). Each parcel's overlay runs are looked
 * up by key (the lateral subquery with `offset 0` is not flattened into a join): a plain join hashed
 * the runs of every parcel of the register, so the time grew with the register, not the proposal.
 */
export async function overlayOfProposal(db: Db, proposalId: number, extra: number[] = []): Promise<ProposalOverlay> {
  const r = await db.raw(
    `with cur as (select distinct on (kind) id, kind, version from reference_layer_version where status = 'published' order by kind, version desc),
     pp as (select parcel_id, part, area_ha from proposal_parcel where proposal_id = ?
            union all select id, null, area_ha from parcel where id = any(?::bigint[]))
     select pp.parcel_id::int as parcel_id, cur.kind, cur.version, run.covered_share,
            coalesce((select json_agg(json_build_object('class', o.class, 'areaHa', o.area_ha, 'share', o.share) order by o.class) from parcel_overlay o
                      where o.parcel_id = pp.parcel_id and o.layer_version_id = cur.id), '[]') as classes
     from pp cross join cur cross join lateral (select r.covered_share from parcel_overlay_run r
       where r.parcel_id = pp.parcel_id and r.layer_version_id = cur.id offset 0) run
     where pp.part is null
     union all
     select pp.parcel_id::int, cur.kind, cur.version, least(1, coalesce(z.covered, 0)), coalesce(z.classes, '[]')
     from pp cross join cur cross join lateral (
       select sum(a / 10000 / pp.area_ha) as covered,
              json_agg(json_build_object('class', class, 'areaHa', a / 10000, 'share', least(1, a / 10000 / pp.area_ha)) order by class) as classes
       from (select r.class, st_area(st_union(st_intersection(pp.part, r.geom))::geography) a
             from reference_feature r where r.version_id = cur.id and r.geom && pp.part and st_intersects(pp.part, r.geom) group by r.class) x
       where a > 0) z
     where pp.part is not null`,
    [proposalId, extra],
  );
  const out: ProposalOverlay = new Map();
  for (const row of r.rows as {
    parcel_id: number;
    kind: ReferenceKind;
    version: number;
    covered_share: number | null;
    classes: OverlayRow['classes'];
  }[]) {
    const list = out.get(row.parcel_id) ?? [];
    list.push({ kind: row.kind, layerVersion: row.version, coveredShare: row.covered_share, classes: row.classes });
    out.set(row.parcel_id, list);
  }
  return out;
}

/** Land-use events of many parcels at once, for the status flags. */
export async function eventsOfParcels(db: Db, ids: number[]) {
  const r = await db.raw(
    `select parcel_id::int as parcel_id, to_char(event_date, 'YYYY-MM-DD') as date, kind, value, cultivation from ` +
      `land_use_event where parcel_id = any(?::bigint[]) order by parcel_id, event_date, id`,
    [ids],
  );
  return r.rows as {
    parcel_id: number;
    date: string;
    kind: 'land-use' | 'management' | 'tillage' | 'reseeding';
    value: string | null;
    cultivation: boolean;
  }[];
}

/**
 * Permanent grassland converted on each holding by OTHER proposals (submitted or later, not
 * withdrawn; decided ones only when approved) submitted within the window before this one. Parcels count when the other proposal
 * turns grassland into cropland; their area is the area that proposal names. The holdings are matched
 * as a set (`in (select unnest(…))`, hashed): `= any(array)` compares each row with every holding in turn,
 * which took over a second for a 2,000-parcel proposal on a register with earlier ones.
 */
export async function earlierOnHoldings(db: Db, proposalId: number, ownerRefs: string[], windowYears: number) {
  const r = await db.raw(
    `select pr.owner_ref, p.reference, sum(pp.area_ha) as area_ha
     from proposal p join proposal_parcel pp on pp.proposal_id = p.id join parcel pr on pr.id = pp.parcel_id
     where p.id <> ? and pr.owner_ref in (select unnest(?::text[]))
       and (p.state in ('submitted', 'in-assessment', 'assessed', 'on-agenda')
            or (p.state = 'decided' and exists (select 1 from board_decision d where d.proposal_id = p.id and ` +
      `d.outcome in ('approved', 'approved-with-conditions'))))
       and p.proposed->>'landUse' = 'cropland'
       and p.submitted_at >= now() - make_interval(years => ?)
       and p.submitted_at <= coalesce((select submitted_at from proposal where id = ?), now())
       and (pr.land_use is null or pr.land_use not in ('arable'))
     group by pr.owner_ref, p.reference order by p.reference`,
    [proposalId, ownerRefs, windowYears, proposalId],
  );
  return r.rows as { owner_ref: string; reference: string; area_ha: number }[];
}
