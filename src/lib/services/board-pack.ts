/**
 * The board pack of an agenda item: what members read before they vote. Built from the signed
 * assessment the item names (figures, range, risk reasons, alternatives, findings), the proposal's
 * statutory clock, its parcels' boundaries and facts, and an impact preview computed now: the
 * region's permanent-grassland ratio and the year's carbon budget if the board approves.
 * Never applicants, owners or holding references: the pack goes to every board member.
 */
import type { LandUseState } from '../carbon';
import { STANDARD_CAUTIONS } from '../carbon/cautions';
import * as assessments from '../db/assessments';
import { db, type Db } from '../db/client';
import * as store from '../db/meetings';
import * as proposals from '../db/proposals';
import { referenceRatio, regionStats } from '../db/regions';
import { committedCo2e } from '../db/register';
import { HttpError } from '../http/errors';
import { clockOf } from '../board/clock';
import type { GradeFacts } from '../rules';
import { regionFacts } from '../rules/region-facts';
import type { StoredResult } from './assessments';

const today = () => new Date().toISOString().slice(0, 10);

type Facts = Pick<GradeFacts, 'parcels' | 'regions'>;

type RegionFigures = {
  stat: Awaited<ReturnType<typeof regionStats>>[number] | undefined;
  ref: Awaited<ReturnType<typeof referenceRatio>>;
};
/** Region figures read once per region for all the items of a meeting. */
export type RegionMemo = Map<string, Promise<RegionFigures>>;

async function regionImpact(conn: Db, facts: Facts, memo: RegionMemo) {
  const out = [];
  for (const r of facts.regions) {
    if (!memo.has(r.key))
      memo.set(
        r.key,
        (async () => ({
          stat: (await regionStats(conn, today(), [r.key]))[0],
          ref: await referenceRatio(conn, r.key),
        }))(),
      );
    const { stat, ref } = await memo.get(r.key)!;
    if (!stat) continue;
    const f = regionFacts(stat, ref ? { ratio: ref.ratio, referenceYear: ref.referenceYear } : null, r.convertedHa);
    out.push({ ...f, referenceSource: ref?.source ?? null });
  }
  return out;
}

async function budgetImpact(conn: Db, year: number, co2eT: number) {
  const settings = await proposals.getProposalSettings(conn);
  const budgetT = settings['budget.yearly-co2e-t'];
  const committedT = await committedCo2e(conn, year);
  const afterT = committedT + co2eT;
  return {
    year,
    budgetT,
    committedT,
    proposalT: co2eT,
    afterT,
    shareAfter: budgetT ? afterT / budgetT : null,
    overBudget: budgetT ? afterT > budgetT : null,
  };
}

/** One item's pack. */
export async function itemPack(meetingId: number, itemId: number, conn: Db = db, memo: RegionMemo = new Map()) {
  const item = await store.getItem(conn, meetingId, itemId);
  if (!item) throw new HttpError('NOT_FOUND', `No item ${itemId} on meeting ${meetingId}.`);
  const [p, a, parcels, settings] = await Promise.all([
    proposals.getProposal(conn, item.proposal_id),
    assessments.getAssessment(conn, item.assessment_id),
    proposals.listParcels(conn, item.proposal_id),
    proposals.getProposalSettings(conn),
  ]);
  if (!p || !a) throw new HttpError('NOT_FOUND', `Item ${itemId} has lost its proposal or assessment.`);
  const r = a.result as unknown as StoredResult;
  const facts = r.facts as unknown as Facts;
  const [regions, budget] = await Promise.all([
    regionImpact(conn, facts, memo),
    budgetImpact(conn, p.start_year, r.totals.co2eTotal),
  ]);
  return {
    meeting: { id: item.meeting_id, date: item.meeting_date, place: item.place },
    item: { id: item.id, position: item.position, status: item.status },
    proposal: {
      id: p.id,
      reference: p.reference,
      title: p.title,
      state: p.state,
      proposed: p.proposed,
      startYear: p.start_year,
    },
    clock: clockOf(p.decision_due, p.state, settings['proposal.reminder-days']),
    parcels: parcels.map((x) => {
      const assessed = r.parcels.find((y) => y.parcelId === x.parcel_id);
      const f = facts.parcels.find((y) => y.parcelId === x.parcel_id);
      return {
        reference: x.reference,
        areaHa: x.area_ha,
        parcelAreaHa: x.parcel_area_ha,
        part: x.part !== null,
        geometry: (x.part ?? x.geometry) as unknown as { type: 'MultiPolygon'; coordinates: number[][][][] },
        currentState: (assessed?.request?.before ?? null) as LandUseState | null,
        stateSource: assessed?.currentState ?? null,
        climate: assessed?.overlay.climate ?? null,
        soils: assessed?.overlay.soils ?? [],
        overlayFlags: assessed?.overlay.flags ?? [],
        regionKey: f?.regionKey ?? null,
        permanentGrassland: f?.flags.permanentGrassland ?? null,
        neverTilled: f?.flags.neverTilled ?? null,
        sensitiveShare: f?.sensitive.share ?? 0,
        co2eTotal: assessed?.figures?.co2eTotal ?? null,
      };
    }),
    assessment: {
      id: a.id,
      number: a.number,
      signedBy: a.signed_by_name,
      signedAt: a.signed_at?.toISOString() ?? null,
      findings: a.findings ?? '',
      factorSet: r.factorSet,
      gwp: r.gwp,
      totals: r.totals,
    },
    risk: {
      level: r.grade.level,
      label: r.grade.label,
      reasons: r.grade.reasons.map((x) => ({ text: x.text, citation: x.citation, level: x.level, gate: x.gate })),
      ruleSet: r.grade.ruleSet,
    },
    alternatives: r.alternatives,
    impact: { regions, budget },
    cautions: [
      ...new Set([...STANDARD_CAUTIONS, ...r.cautions.filter((c) => !c.startsWith('Unconfirmed value used:'))]),
    ],
  };
}

export type ItemPack = Awaited<ReturnType<typeof itemPack>>;

/** The packs of every item on a meeting, in agenda order (withdrawn items left out). */
export async function meetingPacks(meetingId: number, conn: Db = db) {
  const m = await store.getMeeting(conn, meetingId);
  if (!m) throw new HttpError('NOT_FOUND', `No meeting with id ${meetingId}.`);
  const items = (await store.listItems(conn, meetingId)).filter((i) => i.status !== 'withdrawn');
  const packs: ItemPack[] = [];
  const memo: RegionMemo = new Map();
  for (const i of items) packs.push(await itemPack(meetingId, i.id, conn, memo));
  return { meeting: { id: m.id, date: m.meeting_date, place: m.place }, packs };
}
