/**
 * SQL behind the staff dashboard: approved parcels from the register, CO2e committed per budget
 * year, conditions with their due dates and proposals past their statutory decision date.
 * Only current entries count (an entry superseded by a correction or appeal outcome does not).
 */
import type { Db } from './client';

const CURRENT = 'not exists (select 1 from register_entry s where s.supersedes_seq = e.seq)';
const APPROVED = "e.outcome in ('approved', 'approved-with-conditions')";

export type ApprovedParcelRow = {
  seq: number;
  year: number;
  decidedOn: string;
  region: string | null;
  reference: string;
  areaHa: number;
  proposedLandUse: string;
  priorLandUse: string | null;
  /** The newest land use recorded for the parcel on or after the decision date (null when none is). */
  laterLandUse: string | null;
};

/** Every parcel of every current approval, with its land use before the decision (the land-use record, else the parcel's stated use). */
export async function approvedParcels(conn: Db): Promise<ApprovedParcelRow[]> {
  const r = await conn.raw(
    `select e.seq::float8 as seq, e.decided_year as year, e.content->>'decidedOn' as "decidedOn", e.region, x.ref as reference, x.area::float8 as "areaHa",
            trim(split_part(e.content->'proposal'->>'proposedUse', ',', 1)) as "proposedLandUse",
            coalesce((select le.value from land_use_event le where le.parcel_id = p.id and le.kind = 'land-use' ` +
      `and le.event_date < (e.content->>'decidedOn')::date
                      order by le.event_date desc, le.id desc limit 1), p.land_use) as "priorLandUse",
            (select le.value from land_use_event le where le.parcel_id = p.id and le.kind = 'land-use' and le.event_date >= (e.content->>'decidedOn')::date
             order by le.event_date desc, le.id desc limit 1) as "laterLandUse"
     from register_entry e
     cross join lateral (select q->>'reference' as ref, (q->>'areaHa')::float8 as area from jsonb_array_elements(e.content->'parcels') q) x
     left join parcel p on p.reference = x.ref
     where ${APPROVED} and ${CURRENT} order by e.seq`,
  );
  return r.rows;
}

/** CO2e of current approvals by the proposals' start year (the budget year), as `committedCo2e` counts it. */
export async function committedByYear(conn: Db): Promise<{ year: number; committedT: number }[]> {
  const r = await conn.raw(
    `select (e.content->'proposal'->>'startYear')::int as year, sum((e.content->'figures'->>'co2eTotal')::float8) as "committedT"
     from register_entry e where ${APPROVED} and ${CURRENT} group by 1 order by 1`,
  );
  return r.rows.map((x: { year: number; committedT: number }) => ({
    year: Number(x.year),
    committedT: Number(x.committedT),
  }));
}

export type ConditionRow = { seq: number; reference: string; text: string; dueDate: string; checkedBy: string };

/**
 * The open conditions of approvals with their due dates: the one place the dashboard reads
 * conditions from.
 */
export async function conditionsWithDueDates(conn: Db): Promise<ConditionRow[]> {
  // Open follow-up tasks of conditions (src/lib/services/follow-ups.ts): a condition whose outcome
  // staff recorded as done leaves the list; "partly" and "not done" stay until it is met.
  const r = await conn.raw(
    `select coalesce(d.register_seq, 0)::float8 as seq, p.reference, t.title as text, to_char(t.due_date, ` +
      `'YYYY-MM-DD') as "dueDate", t.checked_by as "checkedBy"
     from follow_up_task t join proposal p on p.id = t.proposal_id left join board_decision d on d.id = t.decision_id
     where t.kind = 'condition' and t.status <> 'done' order by t.due_date, t.id`,
  );
  return r.rows;
}

const OPEN_STATES = ['submitted', 'in-assessment', 'assessed', 'on-agenda'];

/** Proposals still before the authority whose statutory decision date has passed. */
export async function overdueProposals(
  conn: Db,
  today: string,
): Promise<{ id: number; reference: string; title: string; state: string; decisionDue: string }[]> {
  const r = await conn.raw(
    `select id::int as id, reference, title, state, to_char(decision_due, 'YYYY-MM-DD') as "decisionDue" from proposal
     where state = any(?::text[]) and decision_due < ?::date order by decision_due, id`,
    [OPEN_STATES, today],
  );
  return r.rows;
}
