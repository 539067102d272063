/**
 * Compensation parcels: an approval whose signed assessment named a cropland parcel to restore to
 * grassland credits that restoration's CO2e gain (in the decision's register entry) and tracks the
 * parcel until the permanence date. A land-use event that ploughs or converts the parcel within that
 * period appends a `compensation-reversed` entry in the event's own transaction, sets the chair a
 * follow-up task and mails the chair.
 */
import { formatDate } from '~/lib/format/dates';
import type { MultiPolygon } from 'geojson';
import { recordAudit } from '../db/audit';
import type { Db } from '../db/client';
import { getFollowUpSettings, insertTask } from '../db/follow-ups';
import { appendEntry, getEntry } from '../db/register';
import { addYears } from '../follow-ups/settings';
import { swardBroken } from '../follow-ups/sward';
import type { Caller } from '../http/handle';
import { compensationReversedMail } from '../mail/templates';
import { estimatesAsApi, type ParcelRequest } from '../proposals/assessment-figures';
import { addDays } from '../proposals/states';
import { reversalContent } from '../register/build';
import type { Condition, RegisterContent } from '../register/content';
import { referenceKey } from '../gis/references';
import { HttpError } from '../http/errors';
import { loadPublished } from './factor-sets';
import { followUpsUrl } from './follow-ups';
import { mailRole } from './proposals';

export type CompensationCredit = {
  parcelId: number;
  parcelReference: string;
  areaHa: number;
  creditedCo2e: number;
  creditedSocT: number;
  permanenceUntil: string;
};

/** What an approval credits for the compensation parcel its signed assessment named; null when none (or nothing to gain). */
export async function compensationCredit(
  trx: Db,
  a: { inputs: Record<string, unknown>; result: unknown },
  effectiveDate: string,
): Promise<CompensationCredit | null> {
  const parcelId = a.inputs.compensationParcelId as number | undefined;
  const request = (a.result as { compensationRequest?: ParcelRequest | null }).compensationRequest ?? null;
  if (!parcelId || !request) return null;
  const set = await loadPublished(trx, request.factorSet, request.factorSetVersion);
  const estimate = estimatesAsApi([request], set)[0];
  if (!estimate || estimate.co2eTotal >= 0) return null;
  const p = await trx('parcel').select('reference', 'area_ha').where({ id: parcelId }).first();
  if (!p) return null;
  const years = (await getFollowUpSettings(trx))['compensation.permanence-years'];
  return {
    parcelId,
    parcelReference: p.reference,
    areaHa: request.areaHa,
    creditedCo2e: -estimate.co2eTotal,
    creditedSocT: Math.max(0, estimate.socChangeTotal),
    permanenceUntil: addYears(effectiveDate, years),
  };
}

/**
 * Parcels that conditions require restored to grassland (other than the assessment's compensation
 * parcel, which is credited): tracked for permanence with nothing credited. 422 for an unknown reference.
 */
export async function conditionSites(
  trx: Db,
  conditions: Condition[],
  effectiveDate: string,
  creditedParcelId: number | null,
): Promise<CompensationCredit[]> {
  const years = (await getFollowUpSettings(trx))['compensation.permanence-years'];
  const out: CompensationCredit[] = [];
  for (const [i, c] of conditions.entries()) {
    if (!c.restoreParcel) continue;
    const p = await trx('parcel')
      .select('id', 'reference', 'area_ha')
      .where({ reference_key: referenceKey(c.restoreParcel) })
      .first();
    if (!p)
      throw new HttpError(
        'UNPROCESSABLE_CONTENT',
        `Condition ${i + 1} names parcel "${c.restoreParcel}" to restore, but the register of parcels has no such parcel.`,
        [{ path: ['conditions', i, 'restoreParcel'], message: 'unknown parcel' }],
      );
    const id = Number(p.id);
    if (id === creditedParcelId || out.some((x) => x.parcelId === id)) continue;
    out.push({
      parcelId: id,
      parcelReference: p.reference,
      areaHa: p.area_ha,
      creditedCo2e: 0,
      creditedSocT: 0,
      permanenceUntil: addYears(effectiveDate, years),
    });
  }
  return out;
}

export async function recordCompensationSite(
  trx: Db,
  c: CompensationCredit & { proposalId: number; decisionId: number; registerSeq: number; effectiveDate: string },
): Promise<number> {
  const [row] = await trx('compensation_site')
    .insert({
      parcel_id: c.parcelId,
      proposal_id: c.proposalId,
      decision_id: c.decisionId,
      register_seq: c.registerSeq,
      credited_co2e_t: c.creditedCo2e,
      credited_soc_t: c.creditedSocT,
      effective_date: c.effectiveDate,
      permanence_until: c.permanenceUntil,
    })
    .returning('id');
  return Number(row.id);
}

type SiteRow = {
  id: number;
  parcel_id: number;
  proposal_id: number;
  register_seq: number;
  credited_co2e_t: number;
  credited_soc_t: number;
  permanence_until: string;
};

/** Called inside the transaction that records a land-use event: reverses every compensation the event breaks. Returns the new entries' seqs. */
export async function reverseBrokenCompensation(
  trx: Db,
  by: Caller,
  e: { parcelId: number; eventId: number; date: string; kind: string; value: string | null },
): Promise<number[]> {
  const what = swardBroken(e.kind, e.value);
  if (!what) return [];
  const sites: SiteRow[] = (
    await trx.raw(
      `select id::int as id, parcel_id::int as parcel_id, proposal_id::int as proposal_id, register_seq::int as ` +
        `register_seq, credited_co2e_t, credited_soc_t, to_char(permanence_until, 'YYYY-MM-DD') as permanence_until
     from compensation_site where parcel_id = ? and status = 'held' and effective_date <= ?::date and permanence_until >= ?::date order by id for update`,
      [e.parcelId, e.date, e.date],
    )
  ).rows;
  const seqs: number[] = [];
  for (const s of sites) {
    const seq = await reverseOne(trx, by, s, { ...e, what });
    if (seq !== null) seqs.push(seq);
  }
  return seqs;
}

async function reverseOne(
  trx: Db,
  by: Caller,
  s: SiteRow,
  e: { eventId: number; date: string; what: string },
): Promise<number | null> {
  const credited = (await getEntry(trx, s.register_seq))!;
  const p = (
    await trx.raw('select reference, area_ha, st_asgeojson(geom, 8)::json as geometry from parcel where id = ?', [
      s.parcel_id,
    ])
  ).rows[0];
  // Only a credited gain is taken back in the register; a parcel a condition required restored, with nothing credited, is flagged to the board only.
  const content =
    s.credited_co2e_t > 0
      ? reversalContent({
          credited: { seq: s.register_seq, content: credited.content as RegisterContent },
          parcel: {
            reference: p.reference,
            areaHa: p.area_ha,
            part: false,
            geometry: p.geometry as MultiPolygon as { type: 'MultiPolygon'; coordinates: number[][][][] },
          },
          creditedCo2e: s.credited_co2e_t,
          creditedSocT: s.credited_soc_t,
          permanenceUntil: s.permanence_until,
          event: { date: e.date, what: e.what },
          recordedAt: new Date().toISOString(),
        })
      : null;
  const entry = content ? await appendEntry(trx, content) : null;
  await trx('compensation_site')
    .where({ id: s.id })
    .update({ status: 'reversed', reversed_seq: entry?.seq ?? null, reversed_event_id: e.eventId });
  const settings = await getFollowUpSettings(trx);
  const ref = (credited.content as RegisterContent).proposal;
  const consequence =
    content && entry
      ? `register entry ${entry.seq} reverses ${content.reverses!.creditedCo2e} t CO2e`
      : `a condition of register entry ${s.register_seq} required it kept in grass`;
  const taskId = await insertTask(trx, {
    proposalId: s.proposal_id,
    decisionId: null,
    kind: 'compensation-reversed',
    assigneeRole: 'chair',
    checkedBy: 'Board chair',
    dueDate: addDays(new Date().toISOString().slice(0, 10), settings['follow-up.reversal-review-days']),
    title:
      `Put before the board: compensation parcel ${p.reference} of ${ref.reference} was broken (${e.what} ` +
      `on ${formatDate(e.date)}) before ${formatDate(s.permanence_until)}; ${consequence}.`,
  });
  await mailRole(trx, 'chair', (u) =>
    compensationReversedMail({
      reference: ref.reference,
      title: ref.title,
      url: followUpsUrl(),
      name: u.name,
      parcel: p.reference,
      eventDate: e.date,
      event: e.what,
      permanenceUntil: s.permanence_until,
      creditedCo2e: content ? `${content.reverses!.creditedCo2e.toLocaleString('en')} t CO2e` : null,
      registerSeq: entry?.seq ?? s.register_seq,
    }),
  );
  await recordAudit(trx, {
    actorId: by.id,
    action: 'compensation.reverse',
    entityType: 'compensation_site',
    entityId: String(s.id),
    details: {
      proposal: ref.reference,
      parcel: p.reference,
      eventId: e.eventId,
      registerSeq: entry?.seq ?? null,
      hash: entry?.hash ?? null,
      taskId,
    },
  });
  return entry?.seq ?? null;
}
