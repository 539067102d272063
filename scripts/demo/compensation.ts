/**
 * One invented past approval with a compensation parcel, and the ploughing of that parcel inside its
 * permanence period, all through the app's own services, so that the register shows one reversed
 * compensation (and the follow-ups page its tasks) on first start:
 * a permanent-grass field approved for spring cereals, with an arable field restored to grass as
 * compensation; the approval took effect two years ago, the field was sown to grass a month later
 * and ploughed again last year.
 */
import { db } from '../../src/lib/db/client';
import type { LandUseState } from '../../src/lib/carbon';
import { addDays } from '../../src/lib/proposals/states';
import { runAssessment, signOff } from '../../src/lib/services/assessments';
import { castVote, createMeeting, recordDecision } from '../../src/lib/services/board';
import { recordEvent } from '../../src/lib/services/parcels';
import { createProposal, transitionProposal } from '../../src/lib/services/proposals';
import { caller } from './region';

const CROP: LandUseState = { landUse: 'cropland', system: 'long-term-cultivated', tillage: 'reduced', input: 'medium' };

/**
 * A demo parcel of the given use that no proposal names yet (last by reference), wholly inside the soil and climate
 * layers; grass not tilled in the last 5 years.
 */
async function freeParcel(landUse: string): Promise<{ id: number; reference: string }> {
  const r = await db.raw(
    `with cur as (select distinct on (kind) id, kind from reference_layer_version where status = 'published' order by kind, version desc),
          covered as (select o.parcel_id from parcel_overlay o join cur on cur.id = o.layer_version_id where cur.kind in ('soil', 'climate')
                      group by o.parcel_id having count(distinct cur.kind) = 2 and min(o.share) > 0 and sum(o.share) >= 1.98)
     select p.id::int as id, p.reference from parcel p join covered c on c.parcel_id = p.id
     where p.reference like 'CM-%' and p.land_use = ? and not exists (select 1 from proposal_parcel pp where pp.parcel_id = p.id)
       and (p.land_use <> 'grassland' or not exists (select 1 from land_use_event e where e.parcel_id = p.id and ` +
      `e.kind = 'tillage' and e.event_date > current_date - interval '5 years'))
     order by p.reference desc limit 1`,
    [landUse],
  );
  if (!r.rows[0]) throw new Error(`the demo region has no free ${landUse} parcel for the compensation demo`);
  return r.rows[0];
}

export async function seedDemoCompensation(emails: {
  planner: string;
  assessor: string;
  board: string;
  chair: string;
}): Promise<string> {
  if (await db('compensation_site').first()) return 'compensation demo not added (compensation sites exist)';
  const [planner, assessor, board, chair] = await Promise.all([
    caller(emails.planner),
    caller(emails.assessor),
    caller(emails.board),
    caller(emails.chair),
  ]);
  const field = await freeParcel('grassland');
  const arable = await freeParcel('arable');
  const today = new Date().toISOString().slice(0, 10);
  const effective = addDays(today, -730);

  const p = await createProposal(planner, {
    title: `Spring cereals on ${field.reference}, ${arable.reference} back to grass`,
    startYear: Number(effective.slice(0, 4)),
    description:
      `Grass field ${field.reference} into a spring cereal rotation; the applicant offers to sow arable ` +
      `field ${arable.reference} to permanent grass in return.`,
    parcels: [{ parcelId: field.id }] as never,
    proposed: CROP,
    applicant: { name: 'Edda Thornquist', contact: 'edda.thornquist@fenbrook-farm.example', interest: 'owner' },
  });
  const v = (await db('proposal').where({ id: p.id }).first()).version;
  await transitionProposal(planner, p.id, { to: 'submitted', version: v });
  const a = await runAssessment(assessor, p.id, {
    sharePercent: 50,
    seed: 1,
    compensationParcelId: arable.id,
  } as never);
  await signOff(assessor, a.id, {
    findings:
      `A typical loss for the district; restoring ${arable.reference} to grass offsets part of it over the ` +
      `transition period, provided it stays in grass.`,
    version: a.version,
  });
  const m = await createMeeting(chair, {
    date: addDays(effective, -29),
    place: 'Tarrow Hall, council room',
    proposalIds: [p.id],
  });
  const item = m.items.find((i) => i.proposalId === p.id)!;
  for (const who of [board, chair]) await castVote(who, m.id, item.id, { choice: 'approve' });
  const d = await recordDecision(chair, m.id, item.id, {
    outcome: 'approved',
    conditions: [],
    effectiveDate: effective,
    reasons: `Approved with the restoration of ${arable.reference} to permanent grass as compensation, as the assessment weighed it.`,
  });
  await recordEvent(planner, arable.id, {
    date: addDays(effective, 30),
    kind: 'land-use',
    value: 'grassland',
    cultivation: false,
    evidence: 'Field officer visit: grass and clover ley established (demo)',
  });
  const ploughed = await recordEvent(planner, arable.id, {
    date: addDays(today, -365),
    kind: 'tillage',
    value: 'ploughing',
    cultivation: false,
    evidence: 'Field officer visit: the field has been ploughed and drilled with barley (demo)',
  });
  const reversal = 'compensationReversedBy' in ploughed ? ploughed.compensationReversedBy?.[0] : undefined;
  return (
    `compensation demo added: ${p.reference} approved (register entry ${d.registerSeq}), compensation ` +
    `parcel ${arable.reference} ploughed, reversed in entry ${reversal ?? 'none'}`
  );
}
