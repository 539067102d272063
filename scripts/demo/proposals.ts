/**
 * Invented demo proposals on the demo region, filed, submitted and assessed through the app's own
 * services so that a new user sees every state and every risk level on first start:
 * - a conversion touching designated sensitive grassland (a hard gate: level 4), signed off;
 * - one holding's conversion split into two proposals, each under 2 ha (the second is caught);
 * - a block conversion that would take its district's permanent-grassland ratio more than 5 %
 *   below the reference year (a hard gate);
 * - a restoration of cropland to grassland, a draft, a returned and a withdrawn proposal.
 * Applicants are invented people with *.example contacts.
 */
import type { MultiPolygon, Polygon } from 'geojson';
import { db } from '../../src/lib/db/client';
import { putSettingValue } from './settings';
import type { LandUseState } from '../../src/lib/carbon';
import type { Caller } from '../../src/lib/http/handle';
import { runAssessment, signOff } from '../../src/lib/services/assessments';
import { createProposal, transitionProposal } from '../../src/lib/services/proposals';
import { caller } from './region';

const CROP: LandUseState = { landUse: 'cropland', system: 'long-term-cultivated', tillage: 'full', input: 'medium' };
const REDUCED: LandUseState = { ...CROP, tillage: 'reduced' };
const GRASS: LandUseState = { landUse: 'grassland', management: 'nominal', input: 'medium' };
const IMPROVED: LandUseState = { landUse: 'grassland', management: 'improved', input: 'high' };

type Candidate = {
  id: number;
  reference: string;
  owner_ref: string | null;
  area_ha: number;
  land_use: string | null;
  region: string | null;
  soil: string | null;
  sensitive: number;
  steep: number;
};

/** Demo parcels with the overlay facts the scenario picks by (one query). */
async function candidates(): Promise<Candidate[]> {
  const r = await db.raw(
    `with cur as (select distinct on (kind) id, kind from reference_layer_version where status = 'published' order by kind, version desc)
     select p.id::int as id, p.reference, p.owner_ref, p.area_ha, p.land_use,
            (select o.class from parcel_overlay o join cur on cur.id = o.layer_version_id and cur.kind = 'region' ` +
      `where o.parcel_id = p.id order by o.share desc limit 1) as region,
            coalesce((select sum(o.share) from parcel_overlay o join cur on cur.id = o.layer_version_id and ` +
      `cur.kind = 'sensitive' where o.parcel_id = p.id), 0) as sensitive,
            (select o.class from parcel_overlay o join cur on cur.id = o.layer_version_id and cur.kind = 'soil' ` +
      `where o.parcel_id = p.id order by o.share desc limit 1) as soil,
            coalesce((select sum(o.share) from parcel_overlay o join cur on cur.id = o.layer_version_id and ` +
      `cur.kind = 'slope' where o.parcel_id = p.id and o.class = 'steep'), 0) as steep
     from parcel p where p.reference like 'CM-%' order by p.reference`,
  );
  return r.rows.map((x: Candidate) => ({ ...x, sensitive: Number(x.sensitive), steep: Number(x.steep) }));
}

/** Grassland parcels whose history makes them permanent grassland: no arable use or tillage in the last 5 years. */
async function permanentGrassland(ids: number[]): Promise<Set<number>> {
  const r = await db.raw(
    `select p.id::int as id from parcel p where p.id = any(?::bigint[]) and p.land_use in ('grassland', 'meadow', 'pasture')
       and exists (select 1 from land_use_event e where e.parcel_id = p.id and e.kind = 'land-use' and e.event_date <= current_date - interval '5 years')
       and not exists (select 1 from land_use_event e where e.parcel_id = p.id and e.event_date > current_date - ` +
      `interval '5 years' and (e.kind = 'tillage' or (e.kind = 'land-use' and e.value = 'arable')))`,
    [ids],
  );
  return new Set(r.rows.map((x: { id: number }) => x.id));
}

/** A square part of about `sideM` metres around the parcel's centre, clipped to the parcel (UTM 28N for the metres). */
export async function partOf(parcelId: number, sideM: number): Promise<Polygon> {
  const r = await db.raw(
    `select st_asgeojson(st_geometryn(st_intersection(p.geom, ` +
      `st_transform(st_expand(st_transform(st_centroid(p.geom), 32628), ?), 4326)), 1), 8)::json as g from parcel p where p.id = ?`,
    [sideM / 2, parcelId],
  );
  return r.rows[0].g as Polygon;
}

const applicants = [
  { name: 'Maren Fallowby', contact: 'maren.fallowby@upland-farms.example', interest: 'owner' },
  { name: 'Corvin Ashdale', contact: '14 Mill Lane, Corrowmere (invented)', interest: 'tenant' },
  { name: 'Petra Lindqvale', contact: 'petra@lindqvale-agents.example', interest: 'agent' },
  { name: 'Hollis Brack', contact: 'hollis.brack@tarrow-mail.example', interest: 'owner' },
] as const;

async function file(
  planner: Caller,
  title: string,
  description: string,
  parcels: { parcelId: number; part?: Polygon | MultiPolygon }[],
  proposed: LandUseState,
  who: number,
  startYear = 2027,
) {
  return createProposal(planner, {
    title,
    description,
    startYear,
    parcels: parcels as never,
    proposed,
    applicant: { ...applicants[who % applicants.length]! },
  });
}

async function move(by: Caller, id: number, to: 'submitted' | 'returned' | 'withdrawn', reason?: string) {
  const v = (await db('proposal').where({ id }).first()).version;
  return transitionProposal(by, id, { to, version: v, reason });
}

export async function seedDemoProposals(plannerEmail: string, assessorEmail: string): Promise<string> {
  if (Number((await db('proposal').count<{ n: number }[]>('* as n'))[0]!.n) > 0)
    return 'demo proposals not added (proposals exist)';
  const planner = await caller(plannerEmail);
  const assessor = await caller(assessorEmail);
  // The demo authority has not yet checked the shipped IPCC tables against the published volumes;
  // it allows sign-off meanwhile, and every assessment names the unconfirmed tables it used.
  await putSettingValue('assessment.allow-unconfirmed-sign-off', true);
  const all = await candidates();
  const pg = await permanentGrassland(all.map((c) => c.id));
  const plain = all.filter((c) => pg.has(c.id) && c.sensitive === 0 && c.steep === 0);
  const used = new Set<number>();
  const take = (pred: (c: Candidate) => boolean, n = 1) => {
    const got = all.filter((c) => !used.has(c.id) && pred(c)).slice(0, n);
    if (got.length < n) throw new Error('the demo region has too few parcels for the demo proposals');
    got.forEach((c) => used.add(c.id));
    return got;
  };
  const made: string[] = [];
  const assess = async (id: number, sign?: string) => {
    const a = await runAssessment(assessor, id, { sharePercent: 50, seed: 1 });
    if (sign) await signOff(assessor, a.id, { findings: sign, version: a.version });
    return a;
  };

  // 1. Sensitive grassland (Skarrowen Head): level 4, signed off.
  const [s] = take((c) => c.sensitive > 0.3 && c.land_use === 'grassland');
  const p1 = await file(
    planner,
    `Plough ${s!.reference} for winter oats`,
    'The applicant wants to plough the field and sow winter oats in rotation with barley.',
    [{ parcelId: s!.id }],
    CROP,
    0,
  );
  await move(planner, p1.id, 'submitted');
  await assess(
    p1.id,
    'Most of the field lies in the Skarrowen Head designated grassland, which may be neither converted nor ' +
      'ploughed. The soil-carbon loss is typical for the region. Recommend refusal.',
  );
  made.push(`${p1.reference} (sensitive, assessed)`);

  // 2. One holding, two small proposals (about 1.2 ha each): the second is caught by the 2 ha holding rule.
  const holding = [...new Set(plain.map((c) => c.owner_ref))].find(
    (h) => h && plain.filter((c) => c.owner_ref === h && !used.has(c.id)).length >= 2,
  )!;
  const [h1, h2] = take((c) => plain.includes(c) && c.owner_ref === holding, 2);
  const p2 = await file(
    planner,
    `North paddock of ${h1!.reference} to spring barley`,
    'A 1.2 ha paddock ploughed for spring barley, the rest of the field kept in grass.',
    [{ parcelId: h1!.id, part: await partOf(h1!.id, 110) }],
    CROP,
    1,
  );
  await move(planner, p2.id, 'submitted');
  await assess(
    p2.id,
    'A small paddock below the 2 ha screening threshold on its own; the loss per hectare is typical. No objection ' +
      'on carbon grounds beyond the usual conditions.',
  );
  const p3 = await file(
    planner,
    `South paddock of ${h2!.reference} to spring barley`,
    'A second 1.2 ha paddock on the same holding, ploughed for spring barley.',
    [{ parcelId: h2!.id, part: await partOf(h2!.id, 110) }],
    CROP,
    1,
  );
  await move(planner, p3.id, 'submitted');
  await assess(p3.id);
  made.push(`${p2.reference} + ${p3.reference} (split on one holding)`);

  // 3. A block conversion in Fenbrook district: the district's ratio would fall more than 5 % below 2018.
  const block = take((c) => plain.includes(c) && c.region === 'fenbrook', 5);
  const p4 = await file(
    planner,
    'Fenbrook block to arable rotation',
    'Five adjoining grass fields brought into a potato and cereal rotation.',
    block.map((c) => ({ parcelId: c.id })),
    REDUCED,
    2,
  );
  await move(planner, p4.id, 'submitted');
  await assess(p4.id);
  made.push(`${p4.reference} (district ratio)`);

  // 4. Restoration of cropland to grassland (a gain), submitted and waiting.
  const [arable] = take((c) => c.land_use === 'arable' && c.sensitive === 0);
  const p5 = await file(
    planner,
    `Return ${arable!.reference} to permanent grass`,
    'Arable field sown to a grass and clover ley to be kept as permanent grassland.',
    [{ parcelId: arable!.id }],
    GRASS,
    3,
  );
  await move(planner, p5.id, 'submitted');
  await assess(
    p5.id,
    'Returning arable land to permanent grass gains soil carbon over the transition period; no objection.',
  );
  made.push(`${p5.reference} (restoration, assessed)`);

  // 5. A small strip with reduced tillage and manure, on a holding with no other proposal: a closer look only.
  const tilledBefore = await db.raw(`select distinct parcel_id::int as id from land_use_event where kind = 'tillage'`);
  const tilled = new Set(tilledBefore.rows.map((x: { id: number }) => x.id));
  const otherHoldings = new Set([...used].map((id) => all.find((c) => c.id === id)!.owner_ref));
  const [strip] = take(
    (c) => plain.includes(c) && c.soil === 'hac' && tilled.has(c.id) && !otherHoldings.has(c.owner_ref),
  );
  const p9 = await file(
    planner,
    `Reduced-tillage strip on ${strip!.reference}`,
    'A one-hectare strip sown to a cereal and lucerne rotation with reduced tillage.',
    [{ parcelId: strip!.id, part: await partOf(strip!.id, 100) }],
    REDUCED,
    3,
  );
  await move(planner, p9.id, 'submitted');
  await assess(
    p9.id,
    'A small strip on land ploughed before; the loss per hectare passes the first threshold only. No objection with the usual conditions.',
  );
  made.push(`${p9.reference} (small strip, assessed)`);

  // 6. A draft, a returned and a withdrawn proposal.
  const [d] = take((c) => plain.includes(c));
  const p6 = await file(
    planner,
    `Improve the sward on ${d!.reference}`,
    'Overseeding with clover and a lime and fertiliser plan to raise the grazing yield.',
    [{ parcelId: d!.id }],
    IMPROVED,
    0,
  );
  made.push(`${p6.reference} (draft)`);
  const [r] = take((c) => plain.includes(c));
  const p7 = await file(
    planner,
    `Plough ${r!.reference} for maize`,
    'Maize for the anaerobic digester at the farm.',
    [{ parcelId: r!.id }],
    CROP,
    2,
  );
  await move(planner, p7.id, 'submitted');
  await move(
    assessor,
    p7.id,
    'returned',
    'Please send the tenancy agreement: the applicant is an agent, and we need the landlord’s consent to the ploughing.',
  );
  made.push(`${p7.reference} (returned)`);
  const [w] = take((c) => plain.includes(c));
  const p8 = await file(
    planner,
    `Plough ${w!.reference} for potatoes`,
    'A single season of potatoes before reseeding.',
    [{ parcelId: w!.id }],
    CROP,
    3,
  );
  await move(planner, p8.id, 'submitted');
  await move(planner, p8.id, 'withdrawn', 'The applicant has sold the field and no longer wishes to proceed.');
  made.push(`${p8.reference} (withdrawn)`);
  return `demo proposals added: ${made.join('; ')}`;
}
