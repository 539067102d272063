/**
 * Invented board history of the Upper Tarrow Grassland Authority, 2021–2026, so the register, the
 * dashboard and the headroom figures have something to show on first start. Everything goes
 * through the app's own services in time order (file → submit → assess → sign off → meeting →
 * votes → decision, dated with the meeting): approvals, conditional approvals, refusals, a
 * restoration, a deferral carried to the next meeting, and one correction of an earlier entry.
 * Conversions are paddocks of about 1.2 ha drawn inside a parcel; restorations whole arable
 * parcels. Applicants, places and figures are invented.
 */
import type { LandUseState } from '../../src/lib/carbon';
import { db } from '../../src/lib/db/client';
import type { Caller } from '../../src/lib/http/handle';
import type { Condition } from '../../src/lib/register/content';
import { runAssessment, signOff } from '../../src/lib/services/assessments';
import { castVote, createMeeting, recordDecision } from '../../src/lib/services/board';
import { createProposal, transitionProposal } from '../../src/lib/services/proposals';
import { correctEntry } from '../../src/lib/services/register';
import { partOf } from './proposals';
import { caller } from './region';

const CROP: LandUseState = { landUse: 'cropland', system: 'long-term-cultivated', tillage: 'full', input: 'medium' };
const REDUCED: LandUseState = { ...CROP, tillage: 'reduced' };
const GRASS: LandUseState = { landUse: 'grassland', management: 'nominal', input: 'medium' };

type Outcome = 'approved' | 'approved-with-conditions' | 'refused' | 'deferred';
type Case = {
  region: 'skarrow' | 'fenbrook' | 'tembiri';
  from: 'grass' | 'arable';
  proposed: LandUseState;
  title: string;
  description: string;
  startYear: number;
  outcome: Outcome;
  reasons: string;
  conditions?: Condition[];
  applicant: { name: string; contact: string; interest: 'owner' | 'tenant' | 'agent' };
};
type Meeting = { date: string; place: string; cases: Case[] };

const HALL = 'Tarrow Hall, council room';
const a = (name: string, contact: string, interest: 'owner' | 'tenant' | 'agent' = 'owner') => ({
  name,
  contact,
  interest,
});

const MEETINGS: Meeting[] = [
  {
    date: '2021-03-18',
    place: HALL,
    cases: [
      {
        region: 'skarrow',
        from: 'grass',
        proposed: CROP,
        startYear: 2021,
        outcome: 'approved',
        applicant: a('Brannoch Ferrow', 'b.ferrow@skarrow-farm.example'),
        title: 'Lower field to winter wheat',
        description: 'A grass field on the valley floor ploughed for winter wheat in a cereal rotation.',
        reasons:
          'Grassland improved for silage since the 1990s, outside every designated area, with a typical ' +
          'soil-carbon loss; the district keeps its ratio well above the limit.',
      },
      {
        region: 'fenbrook',
        from: 'grass',
        proposed: CROP,
        startYear: 2021,
        outcome: 'refused',
        applicant: a('Isobel Rainmarsh', 'isobel@rainmarsh.example', 'tenant'),
        title: 'Wet meadow to maize',
        description: 'A wet meadow by the Fen Brook drained and ploughed for maize.',
        reasons:
          'Peaty, waterlogged grassland: the soil-carbon loss per hectare is far above the authority’s threshold, and the field floods in most winters.',
      },
    ],
  },
  {
    date: '2022-06-09',
    place: HALL,
    cases: [
      {
        region: 'skarrow',
        from: 'grass',
        proposed: REDUCED,
        startYear: 2022,
        outcome: 'approved-with-conditions',
        applicant: a('Tamsin Holloway', 'tamsin.holloway@mailbox.example'),
        title: 'Upper pasture to spring barley',
        description: 'Pasture on a gentle slope brought into spring barley with reduced tillage.',
        reasons: 'An acceptable loss with reduced tillage, provided a grass margin protects the burn below the field.',
        conditions: [
          {
            text: 'Keep an unploughed grass margin of at least 6 m along the Skarrow burn.',
            dueDate: '2023-05-31',
            checkedBy: 'Field officer',
          },
        ],
      },
      {
        region: 'fenbrook',
        from: 'arable',
        proposed: GRASS,
        startYear: 2022,
        outcome: 'approved',
        applicant: a('Hollis Brack', 'hollis.brack@tarrow-mail.example'),
        title: 'Arable field back to permanent grass',
        description: 'A light arable field sown to a grass and clover mixture and kept in grass.',
        reasons: 'Returning arable land to grassland gains soil carbon over the transition period.',
      },
    ],
  },
  {
    date: '2023-04-20',
    place: 'Corrowmere village hall',
    cases: [
      {
        region: 'tembiri',
        from: 'grass',
        proposed: CROP,
        startYear: 2023,
        outcome: 'deferred',
        applicant: a('Corvin Ashdale', '14 Mill Lane, Corrowmere (invented)', 'tenant'),
        title: 'Small paddock to vegetables',
        description: 'A small grass paddock ploughed for field vegetables.',
        reasons:
          'The board asks for a site visit to check whether the paddock drains into the Tembiri springs before it decides.',
      },
      {
        region: 'fenbrook',
        from: 'grass',
        proposed: REDUCED,
        startYear: 2023,
        outcome: 'approved',
        applicant: a('Maren Fallowby', 'maren.fallowby@upland-farms.example'),
        title: 'Grass field to a cereal rotation',
        description: 'A grass field ploughed once and kept in a cereal rotation with reduced tillage.',
        reasons:
          'Outside the designated grassland; the loss is typical for the soil, and the district stays within its ratio.',
      },
    ],
  },
  { date: '2023-07-13', place: HALL, cases: [] },
  {
    date: '2024-05-16',
    place: HALL,
    cases: [
      {
        region: 'skarrow',
        from: 'grass',
        proposed: CROP,
        startYear: 2024,
        outcome: 'refused',
        applicant: a('Petra Lindqvale', 'petra@lindqvale-agents.example', 'agent'),
        title: 'Old pasture to potatoes',
        description: 'A long-standing pasture ploughed for seed potatoes.',
        reasons:
          'The pasture has no record of tillage for decades; ploughing it would release old soil carbon for little ' +
          'gain. A rotation on existing arable land is the alternative.',
      },
      {
        region: 'tembiri',
        from: 'arable',
        proposed: GRASS,
        startYear: 2024,
        outcome: 'approved',
        applicant: a('Oskar Wendle', 'oskar.wendle@farmpost.example'),
        title: 'Arable strip back to grass',
        description: 'An arable strip by the springs sown to permanent grass.',
        reasons: 'A restoration that protects the springs and gains soil carbon.',
      },
    ],
  },
  {
    date: '2025-03-20',
    place: HALL,
    cases: [
      {
        region: 'fenbrook',
        from: 'grass',
        proposed: CROP,
        startYear: 2025,
        outcome: 'approved-with-conditions',
        applicant: a('Greta Marlock', 'greta@marlock-holdings.example'),
        title: 'Grass field to oilseed rape',
        description: 'A grass field ploughed for oilseed rape in a rotation.',
        reasons: 'Acceptable with a field-edge margin and a cover crop over winter.',
        conditions: [
          { text: 'Sow a winter cover crop after every harvest.', dueDate: '2025-11-30', checkedBy: 'Field officer' },
          {
            text: 'Report the soil organic carbon of the topsoil sampled after three years.',
            dueDate: '2028-03-31',
            checkedBy: 'Soil adviser',
          },
        ],
      },
      {
        region: 'skarrow',
        from: 'grass',
        proposed: REDUCED,
        startYear: 2025,
        outcome: 'approved',
        applicant: a('Brannoch Ferrow', 'b.ferrow@skarrow-farm.example'),
        title: 'Second field to winter wheat',
        description: 'A second grass field on the same farm ploughed for winter wheat with reduced tillage.',
        reasons: 'With the first field, the farm stays below the area added up for screening; the loss is typical.',
      },
    ],
  },
  {
    date: '2026-02-12',
    place: HALL,
    cases: [
      {
        region: 'tembiri',
        from: 'grass',
        proposed: REDUCED,
        startYear: 2026,
        outcome: 'approved',
        applicant: a('Ines Calloway', 'ines.calloway@mailbox.example'),
        title: 'Paddock to a lucerne rotation',
        description: 'A paddock sown to a cereal and lucerne rotation with reduced tillage.',
        reasons: 'A small area with a modest loss; the district stays within its ratio.',
      },
      {
        region: 'skarrow',
        from: 'grass',
        proposed: CROP,
        startYear: 2026,
        outcome: 'approved-with-conditions',
        applicant: a('Tamsin Holloway', 'tamsin.holloway@mailbox.example'),
        title: 'Hill pasture to fodder beet',
        description: 'A hill pasture ploughed for fodder beet for two seasons, then reseeded.',
        reasons: 'Acceptable for two seasons if the field is reseeded to grass afterwards.',
        conditions: [
          {
            text: 'Reseed the field to grass after the second harvest and report the sowing date.',
            dueDate: '2026-10-31',
            checkedBy: 'Field officer',
          },
        ],
      },
    ],
  },
];

const CHOICE: Record<Outcome, 'approve' | 'approve-with-conditions' | 'refuse' | 'defer'> = {
  approved: 'approve',
  'approved-with-conditions': 'approve-with-conditions',
  refused: 'refuse',
  deferred: 'defer',
};
const ALSO_DEFERRED: Case = {
  ...MEETINGS[2]!.cases[0]!,
  outcome: 'approved-with-conditions',
  reasons: 'The site visit found the paddock drains away from the springs. Approved with a buffer strip.',
  conditions: [
    {
      text: 'Leave a 10 m grass buffer on the side towards the Tembiri springs.',
      dueDate: '2024-10-31',
      checkedBy: 'Field officer',
    },
  ],
};

/** Parcels no proposal uses yet, outside designated grassland and steep ground, by region and use, in reference order. */
async function freeParcels(): Promise<
  { id: number; reference: string; region: string; landUse: string; tilled: boolean }[]
> {
  const r = await db.raw(
    `with cur as (select distinct on (kind) id, kind from reference_layer_version where status = 'published' order by kind, version desc)
     select p.id::int as id, p.reference, p.land_use as "landUse", exists (select 1 from land_use_event e where ` +
      `e.parcel_id = p.id and e.kind = 'tillage') as tilled,
            (select o.class from parcel_overlay o join cur on cur.id = o.layer_version_id and cur.kind = 'region' ` +
      `where o.parcel_id = p.id order by o.share desc limit 1) as region
     from parcel p
     where not exists (select 1 from proposal_parcel pp where pp.parcel_id = p.id)
       and not exists (select 1 from parcel_overlay o join cur on cur.id = o.layer_version_id where o.parcel_id = ` +
      `p.id and ((cur.kind = 'sensitive' and o.share > 0) or (cur.kind = 'slope' and o.class = 'steep' and o.share > 0)))
       and p.area_ha between 1 and 5.5
     order by p.reference`,
  );
  return r.rows;
}

/** Paddock of about 1.2 ha for a conversion (a part drawn in the parcel), the whole parcel for a restoration. */
const PADDOCK_SIDE_M = 110;

async function proposalReady(
  planner: Caller,
  assessor: Caller,
  c: Case,
  parcelId: number,
  filedOn: Date,
): Promise<number> {
  const parcels = c.from === 'grass' ? [{ parcelId, part: await partOf(parcelId, PADDOCK_SIDE_M) }] : [{ parcelId }];
  const p = await createProposal(
    planner,
    {
      title: c.title,
      description: c.description,
      startYear: c.startYear,
      parcels: parcels as never,
      proposed: c.proposed,
      applicant: c.applicant,
    },
    filedOn,
  );
  await transitionProposal(planner, p.id, { to: 'submitted', version: 1 });
  const run = await runAssessment(assessor, p.id, { sharePercent: 50, seed: 1 });
  await signOff(assessor, run.id, {
    findings: `Assessed for the board meeting (demo history, invented). ${c.reasons}`,
    version: run.version,
  });
  return p.id;
}

/** The two demo members vote as decided, then the chair records the decision dated with the meeting. */
async function decideItem(members: Caller[], chair: Caller, meetingId: number, itemId: number, c: Case, on: Date) {
  for (const m of members) await castVote(m, meetingId, itemId, { choice: CHOICE[c.outcome] });
  return recordDecision(
    chair,
    meetingId,
    itemId,
    { outcome: c.outcome, reasons: c.reasons, conditions: c.conditions ?? [] },
    on,
  );
}

export async function seedDemoHistory(emails: {
  planner: string;
  assessor: string;
  board: string;
  chair: string;
}): Promise<string> {
  if (Number((await db('register_entry').count<{ n: number }[]>('* as n'))[0]!.n) > 0)
    return 'demo history not added (the register has entries)';
  const [planner, assessor, board, chair] = await Promise.all(
    [emails.planner, emails.assessor, emails.board, emails.chair].map(caller),
  );
  const free = await freeParcels();
  const used = new Set<number>();
  const pick = (c: Case) => {
    const want = c.from === 'arable' ? ['arable'] : ['grassland', 'meadow'];
    // Grass never recorded as tilled (permanent grassland), or arable land for a restoration.
    const p = free.find(
      (x) => !used.has(x.id) && x.region === c.region && want.includes(x.landUse) && (c.from === 'arable' || !x.tilled),
    );
    if (!p) throw new Error(`the demo region has no free ${c.from} parcel in ${c.region} for the demo history`);
    used.add(p.id);
    return p;
  };
  const decided: { seq: number; c: Case }[] = [];
  for (const m of MEETINGS) {
    const on = new Date(`${m.date}T10:00:00Z`);
    const filedOn = new Date(on.getTime() - 60 * 86_400_000);
    const ids: number[] = [];
    const byProposal = new Map<number, Case>();
    for (const c of m.cases) {
      const parcel = pick(c);
      const id = await proposalReady(planner, assessor, c, parcel.id, filedOn);
      ids.push(id);
      byProposal.set(id, c);
    }
    const meeting = await createMeeting(chair, { date: m.date, place: m.place, proposalIds: ids });
    for (const item of meeting.items) {
      const c = byProposal.get(item.proposalId) ?? ALSO_DEFERRED; // an item carried from an earlier meeting is the deferred case
      const d = await decideItem([board, chair], chair, meeting.id, item.id, c, on);
      if (d.registerSeq) decided.push({ seq: d.registerSeq, c });
    }
  }
  // A correction: the reasons of a 2025 approval named the wrong field; the chair records the corrected entry a week later.
  const wrong = decided.find((d) => d.c.title === 'Second field to winter wheat')!;
  const fix = await correctEntry(
    chair,
    wrong.seq,
    {
      kind: 'correction',
      note: 'The reasons referred to the farm’s first field as lying in Fenbrook district; both fields lie in Skarrow district. The decision is unchanged.',
      reasons:
        'With the farm’s first field (approved in 2021, also in Skarrow district), ' +
        'the farm stays below the area added up for screening; the loss is typical.',
    },
    new Date('2025-03-27T09:00:00Z'),
  );
  return (
    `demo history added: ${MEETINGS.length} meetings 2021–2026, ${decided.length} register entries and a ` +
    `correction (entry ${fix.seq} replaces ${wrong.seq})`
  );
}
