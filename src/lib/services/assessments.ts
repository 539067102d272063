/**
 * Assessment use cases: run (or re-run) the draft, save findings, sign off, read, reproduce.
 * A run estimates every parcel (or drawn part) of a proposal from its overlay and current state,
 * adds the joint range, grades the proposal by the rule set and weighs the alternatives.
 */
import type { z } from 'zod';
import type { assessmentInputsSchema } from '../api/assessments';
import { EstimateInputError, STANDARD_CAUTIONS, type FactorSetDocument, type LandUseState } from '../carbon';
import { recordAudit } from '../db/audit';
import * as store from '../db/assessments';
import { db, withTransaction, type Db } from '../db/client';
import { getGisSettings } from '../db/gis-settings';
import * as proposals from '../db/proposals';
import { deriveLandUseFlags, type LandUseEvent } from '../gis/land-use-history';
import { summariseOverlay, type OverlayRow } from '../gis/overlay-summary';
import { HttpError } from '../http/errors';
import type { Caller } from '../http/handle';
import type { Phases } from '../http/server-timing';
import { enqueueMail } from '../mail/outbox';
import { assessmentSignedMail } from '../mail/templates';
import {
  assessmentFigures,
  estimatesAsApi,
  RESTORED_STATE,
  type ApiEstimate,
  type FigureInput,
  type ParcelRequest,
} from '../proposals/assessment-figures';
import { stateFromRecord } from '../proposals/current-state';
import { checkPlausibility } from '../proposals/plausibility';
import { packResult } from '../proposals/stored-result';
import { gradeProposal, levelInfo, type GradeFacts } from '../rules';
import { buildGradeFacts, publicFacts } from './assessment-facts';
import { defaultSetId, loadPublished } from './factor-sets';
import { applyTransition, mailRole, proposalUrl } from './proposals';
import { loadRuleSet } from './rule-sets';

type Inputs = z.output<typeof assessmentInputsSchema>;
const TRANSITION_YEARS = 20;
const today = () => new Date().toISOString().slice(0, 10);

type ParcelOut = {
  parcelId: number;
  reference: string;
  areaHa: number;
  part: boolean;
  ownerRef: string | null;
  request: ParcelRequest | null;
  currentState: { source: 'record' | 'assessor'; note: string };
  state: LandUseState | null;
  overlay: { climate: string | null; soils: { type: string; fraction: number }[]; flags: string[] };
  overlayRows: OverlayRow[];
  overlaySummary: ReturnType<typeof summariseOverlay>;
  flags: ReturnType<typeof deriveLandUseFlags>;
  problems: string[];
};

/** Soil fractions from the overlay shares, scaled to sum to exactly 1 (the shares are of the covered area). */
function soilFractions(classes: { class: string; share: number }[]): { type: string; fraction: number }[] {
  const total = classes.reduce((s, c) => s + c.share, 0);
  if (total <= 0) return [];
  const out = classes
    .map((c) => ({ type: c.class, fraction: c.share / total }))
    .sort((a, b) => a.type.localeCompare(b.type));
  out[out.length - 1]!.fraction = 1 - out.slice(0, -1).reduce((s, x) => s + x.fraction, 0);
  return out;
}

function parcelInput(
  p: {
    parcel_id: number;
    reference: string;
    area_ha: number;
    part: unknown;
    owner_ref: string | null;
    land_use: string | null;
    management: string | null;
  },
  rows: OverlayRow[],
  events: LandUseEvent[],
  flagOptions: Parameters<typeof deriveLandUseFlags>[1],
  choice: { state: LandUseState; reason: string } | undefined,
  build: (
    climate: string,
    soils: { type: string; fraction: number }[],
    before: LandUseState,
    areaHa: number,
  ) => ParcelRequest,
): ParcelOut {
  const summary = summariseOverlay(rows);
  const problems: string[] = [];
  const climate = summary.climate.dominant;
  for (const k of ['climate', 'soil'] as const) if (summary[k].flag) problems.push(summary[k].flag!);
  const soils = summary.soil.flag ? [] : soilFractions(summary.soil.classes);
  const recorded = stateFromRecord(p.land_use, p.management);
  const state = choice?.state ?? recorded.state;
  const currentState = choice
    ? { source: 'assessor' as const, note: choice.reason }
    : { source: 'record' as const, note: recorded.note };
  if (!state) problems.push(recorded.note);
  let request: ParcelRequest | null = null;
  if (problems.length === 0 && climate && soils.length && state) request = build(climate, soils, state, p.area_ha);
  return {
    parcelId: p.parcel_id,
    reference: p.reference,
    areaHa: p.area_ha,
    part: p.part !== null,
    ownerRef: p.owner_ref,
    request,
    currentState,
    state,
    overlay: { climate, soils, flags: [summary.climate.flag, summary.soil.flag].filter((x): x is string => !!x) },
    overlayRows: rows,
    overlaySummary: summary,
    flags: deriveLandUseFlags(events, flagOptions),
    problems,
  };
}

async function loadInputs(
  conn: Db,
  proposalId: number,
  input: Inputs,
  set: FactorSetDocument,
  gwp: string,
  phases?: Phases,
) {
  const rows = await proposals.listParcels(conn, proposalId);
  phases?.mark('parcels');
  const extra = input.compensationParcelId ? [input.compensationParcelId] : [];
  // One after another: inside a transaction they share one connection.
  const overlay = await store.overlayOfProposal(conn, proposalId, extra);
  phases?.mark('overlay');
  const events = await store.eventsOfParcels(conn, [...rows.map((r) => r.parcel_id), ...extra]);
  phases?.mark('events');
  const gis = await getGisSettings(conn);
  const byParcel = new Map<number, LandUseEvent[]>();
  for (const e of events)
    byParcel.set(e.parcel_id, [
      ...(byParcel.get(e.parcel_id) ?? []),
      { date: e.date, kind: e.kind, value: e.value, cultivation: e.cultivation },
    ]);
  const flagOptions = {
    asOf: today(),
    permanentGrasslandYears: gis['land-use.permanent-grassland-years'],
    uncultivatedYears: gis['land-use.uncultivated-years'],
    tillageEndsGrassland: gis['land-use.tillage-ends-grassland'],
  };
  const choices = new Map((input.currentStates ?? []).map((c) => [c.parcelId, c]));
  const build =
    (after: LandUseState) =>
    (
      climate: string,
      soils: { type: string; fraction: number }[],
      before: LandUseState,
      areaHa: number,
    ): ParcelRequest =>
      ({
        factorSet: set.id,
        factorSetVersion: set.version,
        climate,
        soils,
        areaHa,
        before,
        after,
        transitionYears: TRANSITION_YEARS,
        gwp,
        biomass: true,
        n2o: true,
      }) as ParcelRequest;
  return { rows, overlay, byParcel, flagOptions, choices, build };
}

async function compensationInput(
  conn: Db,
  input: Inputs,
  loaded: Awaited<ReturnType<typeof loadInputs>>,
  proposalParcelIds: number[],
): Promise<FigureInput['compensation']> {
  const id = input.compensationParcelId;
  if (!id) return null;
  if (proposalParcelIds.includes(id))
    return { request: null, note: 'The parcel named for compensation is part of the proposal itself.' };
  const p = await conn('parcel')
    .select('id', 'reference', 'area_ha', 'owner_ref', 'land_use', 'management')
    .where({ id })
    .first();
  if (!p)
    throw new HttpError('UNPROCESSABLE_CONTENT', `No parcel with id ${id} to restore.`, [
      { path: ['compensationParcelId'], message: 'unknown parcel' },
    ]);
  const out = parcelInput(
    {
      parcel_id: Number(p.id),
      reference: p.reference,
      area_ha: p.area_ha,
      part: null,
      owner_ref: p.owner_ref,
      land_use: p.land_use,
      management: p.management,
    },
    loaded.overlay.get(Number(p.id)) ?? [],
    loaded.byParcel.get(Number(p.id)) ?? [],
    loaded.flagOptions,
    loaded.choices.get(Number(p.id)),
    loaded.build(RESTORED_STATE),
  );
  if (out.state?.landUse !== 'cropland')
    return {
      request: null,
      note: `Parcel ${p.reference} is not cropland, so restoring it to grassland gains nothing to set against the proposal.`,
    };
  if (!out.request)
    return { request: null, note: `Parcel ${p.reference} cannot be estimated: ${out.problems.join(' ')}` };
  return {
    request: out.request,
    note: `Parcel ${p.reference} (${p.area_ha.toFixed(2)} ha) restored from cropland to nominally managed grassland.`,
  };
}

/** Everything an assessment computes, from the database as it is now. */
async function compute(conn: Db, proposal: proposals.ProposalRow, input: Inputs, phases?: Phases) {
  const settings = await proposals.getProposalSettings(conn);
  const setId = input.factorSet ?? (await defaultSetId(conn));
  const gwp = input.gwp ?? settings['assessment.gwp'];
  if (
    (input.factorSet && input.factorSet !== (await defaultSetId(conn))) ||
    (input.gwp && input.gwp !== settings['assessment.gwp']) ||
    input.factorSetVersion
  ) {
    if (!input.overrideReason)
      throw new HttpError(
        'UNPROCESSABLE_CONTENT',
        'You chose another factor set, version or GWP than the authority’s default; give the reason in overrideReason.',
        [{ path: ['overrideReason'], message: 'required for an override' }],
      );
  }
  const set = await loadPublished(conn, setId, input.factorSetVersion);
  const rules = await loadRuleSet(conn, input.ruleSet, input.ruleSetVersion);
  phases?.mark('sets');
  const loaded = await loadInputs(conn, proposal.id, input, set, gwp, phases);
  const parcels = loaded.rows.map((r) =>
    parcelInput(
      r,
      loaded.overlay.get(r.parcel_id) ?? [],
      loaded.byParcel.get(r.parcel_id) ?? [],
      loaded.flagOptions,
      loaded.choices.get(r.parcel_id),
      loaded.build(proposal.proposed),
    ),
  );
  const figureInput: FigureInput = {
    requests: parcels.map((p) => ({ parcelId: p.parcelId, areaHa: p.areaHa, request: p.request })),
    proposed: proposal.proposed,
    sharePercent: input.sharePercent,
    runs: settings['assessment.runs'],
    seed: input.seed,
    compensation: await compensationInput(
      conn,
      input,
      loaded,
      parcels.map((p) => p.parcelId),
    ),
  };
  phases?.mark('requests');
  let figures: ReturnType<typeof assessmentFigures>;
  try {
    figures = assessmentFigures(figureInput, set, phases && ((name) => phases.mark(name)));
  } catch (err) {
    if (err instanceof EstimateInputError)
      throw new HttpError(
        'UNPROCESSABLE_CONTENT',
        `The estimate cannot be made: ${err.issues.map((i) => i.message).join(' ')}`,
        err.issues,
      );
    throw err;
  }
  const facts = await buildGradeFacts(conn, {
    proposal,
    parcels,
    estimates: figures.estimates,
    totals: figures.totals,
    settings,
    rules: rules.document,
  });
  phases?.mark('facts');
  const grade = gradeProposal(facts, rules.document, rules.ref);
  phases?.mark('grade');
  return { set, gwp, rules, parcels, figureInput, figures, facts, grade, settings };
}

type Computed = Awaited<ReturnType<typeof compute>>;

/** The figures of an estimate that a signed assessment keeps; the rest (trajectory, factors, cautions) follows from the request and the pinned set. */
function compactFigures(e: ApiEstimate | null) {
  if (!e) return null;
  const {
    socBeforePerHa,
    socAfterPerHa,
    socChangeTotal,
    annualSocChange,
    biomassChangeTotal,
    n2oTotal,
    co2eTotal,
    co2eParts,
  } = e;
  return {
    socBeforePerHa,
    socAfterPerHa,
    socChangeTotal,
    annualSocChange,
    biomassChangeTotal,
    n2oTotal,
    co2eTotal,
    co2eParts,
  };
}

function resultOf(c: Computed) {
  const { parcels, figures, set, grade } = c;
  // Indices of the parcels converted (not indexOf per parcel: that is quadratic in a large proposal).
  const converting = parcels.flatMap((p, i) =>
    figures.estimates[i] && p.state?.landUse === 'grassland' && c.figureInput.proposed.landUse === 'cropland'
      ? [i]
      : [],
  );
  const area = converting.reduce((s, i) => s + parcels[i]!.areaHa, 0);
  const weighted = (k: 'socBeforePerHa' | 'socAfterPerHa') =>
    area > 0 ? converting.reduce((s, i) => s + figures.estimates[i]![k] * parcels[i]!.areaHa, 0) / area : 0;
  const plausibility = checkPlausibility(converting.length > 0, weighted('socBeforePerHa'), weighted('socAfterPerHa'));
  const unconfirmed = [...new Set(figures.estimates.flatMap((e) => e?.unconfirmedTablesUsed ?? []))].sort();
  const blocking: string[] = parcels.flatMap((p) => p.problems.map((x) => `Parcel ${p.reference}: ${x}`));
  if (!figures.estimates.some((e) => e)) blocking.push('No parcel of the proposal could be estimated.');
  if (unconfirmed.length && !c.settings['assessment.allow-unconfirmed-sign-off']) {
    blocking.push(
      `Factor tables not yet confirmed by this authority: ${unconfirmed.join(', ')}. An administrator confirms ` +
        `them against the published document on the factor-set page (or allows sign-off with unconfirmed tables in the settings).`,
    );
  }
  const first = figures.estimates.find((e) => e);
  const cautions = [
    ...new Set([
      ...(first?.cautions ?? STANDARD_CAUTIONS),
      ...figures.jointCautions,
      ...(plausibility.applicable && !plausibility.inBand ? [plausibility.message] : []),
    ]),
  ];
  const info = levelInfo(grade.level);
  return {
    totals: figures.totals,
    parcels: parcels.map((p, i) => ({
      parcelId: p.parcelId,
      reference: p.reference,
      areaHa: p.areaHa,
      part: p.part,
      request: p.request,
      figures: compactFigures(figures.estimates[i]!),
      currentState: p.currentState,
      overlay: p.overlay,
      problems: p.problems,
    })),
    overlayUsed: Object.fromEntries(parcels.map((p) => [p.parcelId, p.overlayRows])),
    grade: { level: grade.level, label: info.label, shape: info.shape, reasons: grade.reasons, ruleSet: grade.ruleSet },
    alternatives: figures.alternatives,
    compensationRequest: c.figureInput.compensation?.request ?? null,
    compensationNote: c.figureInput.compensation?.note ?? null,
    plausibility,
    cautions,
    blocking,
    signOffReady: unconfirmed.length === 0,
    unconfirmedTablesUsed: unconfirmed,
    factorSet: { id: set.id, version: set.version },
    gwp: c.gwp,
    facts: c.facts,
  };
}

export type StoredResult = ReturnType<typeof resultOf>;

/** The API answer: the stored result, each parcel's estimate in full (recomputed from its request with the pinned set unless at hand). */
async function respond(
  row: Omit<store.AssessmentRow, 'result' | 'inputs'> & { result: unknown },
  estimates?: (ApiEstimate | null)[],
) {
  const r = row.result as StoredResult;
  const { overlayUsed: _o, compensationRequest: _c, compensationNote: _n, facts, parcels, ...rest } = r;
  const full =
    estimates ??
    estimatesAsApi(
      parcels.map((p) => p.request as ParcelRequest | null),
      await loadPublished(db, row.factor_set_id, row.factor_set_version),
    );
  return {
    id: row.id,
    proposalId: row.proposal_id,
    number: row.number,
    version: row.version,
    status: row.status,
    ...rest,
    parcels: parcels.map(({ figures: _f, ...p }, i) => ({ ...p, estimate: full[i] ?? null })),
    facts: publicFacts(facts as GradeFacts),
    findings: row.findings,
    signedBy: row.signed_by_name,
    signedAt: row.signed_at?.toISOString() ?? null,
    createdBy: row.created_by_name,
    createdAt: row.created_at.toISOString(),
    updatedAt: row.updated_at.toISOString(),
  };
}

export async function runAssessment(by: Caller, proposalId: number, input: Inputs, phases?: Phases) {
  return withTransaction(db, async (trx) => {
    const p = await proposals.getProposal(trx, proposalId, { lock: true });
    if (!p) throw new HttpError('NOT_FOUND', `No proposal with id ${proposalId}.`);
    if (!['submitted', 'in-assessment', 'assessed'].includes(p.state))
      throw new HttpError(
        'CONFLICT',
        `Proposal ${p.reference} is "${p.state}"; only submitted proposals are assessed.`,
      );
    const draft = await store.draftOf(trx, proposalId);
    if (draft && input.version !== undefined && draft.version !== input.version) {
      throw new HttpError(
        'CONFLICT',
        `Someone else re-ran or edited this assessment after you opened it (it is at version ${draft.version}, you ` +
          `sent ${input.version}). Reload it; nothing was saved.`,
      );
    }
    if (p.state === 'submitted') await applyTransition(trx, by, p, 'in-assessment', undefined);
    if (p.state === 'assessed')
      await applyTransition(
        trx,
        by,
        p,
        'in-assessment',
        input.reason || 'A new version of the assessment was started.',
      );
    phases?.mark('lock');
    const c = await compute(trx, p, input, phases);
    const result = resultOf(c);
    phases?.mark('result');
    const write = {
      inputs: input,
      result: packResult(result),
      factorSet: result.factorSet,
      ruleSet: c.rules.ref,
      gradeLevel: c.grade.level,
      gradeLabel: result.grade.label,
      co2eTotal: result.totals.co2eTotal,
      by: by.id,
    };
    const saved = draft
      ? { id: draft.id, number: draft.number, version: await store.updateDraft(trx, draft.id, write) }
      : { ...(await store.insertAssessment(trx, proposalId, write)), version: 1 };
    await recordAudit(trx, {
      actorId: by.id,
      action: draft ? 'assessment.rerun' : 'assessment.start',
      entityType: 'assessment',
      entityId: String(saved.id),
      details: {
        proposal: p.reference,
        factorSet: result.factorSet,
        ruleSet: c.rules.ref,
        level: c.grade.level,
        co2eTotal: result.totals.co2eTotal,
        overrideReason: input.overrideReason ?? null,
      },
    });
    phases?.mark('store');
    const meta = (await store.getAssessmentMeta(trx, saved.id))!;
    const answer = await respond({ ...meta, result }, c.figures.estimates);
    phases?.mark('response');
    return answer;
  });
}

export async function getAssessment(id: number) {
  const row = await store.getAssessment(db, id);
  if (!row) throw new HttpError('NOT_FOUND', `No assessment with id ${id}.`);
  return respond(row);
}

export async function listAssessments(proposalId: number) {
  if (!(await proposals.getProposal(db, proposalId)))
    throw new HttpError('NOT_FOUND', `No proposal with id ${proposalId}.`);
  const rows = await store.listForProposal(db, proposalId);
  return {
    items: rows.map((a) => ({
      id: a.id,
      number: a.number,
      status: a.status,
      version: a.version,
      riskLevel: a.grade_level,
      riskLabel: a.grade_label,
      co2eTotal: a.co2e_total,
      factorSet: `${a.factor_set_id}@${a.factor_set_version}`,
      ruleSet: a.rule_set_id ? `${a.rule_set_id}@${a.rule_set_version}` : null,
      signedBy: a.signed_by_name,
      signedAt: a.signed_at?.toISOString() ?? null,
      createdAt: a.created_at.toISOString(),
    })),
  };
}

async function lockDraft(trx: Db, id: number, version: number): Promise<store.AssessmentRow> {
  const a = await store.getAssessment(trx, id, { lock: true });
  if (!a) throw new HttpError('NOT_FOUND', `No assessment with id ${id}.`);
  if (a.status !== 'draft')
    throw new HttpError('CONFLICT', `Assessment ${a.number} is signed and frozen; start a new version to change it.`);
  if (a.version !== version)
    throw new HttpError(
      'CONFLICT',
      `Someone else changed this assessment after you opened it (it is at version ${a.version}, you sent ${version}). Reload it; nothing was saved.`,
    );
  return a;
}

export async function saveFindings(by: Caller, id: number, input: { findings: string; version: number }) {
  return withTransaction(db, async (trx) => {
    await lockDraft(trx, id, input.version);
    const version = await store.saveFindings(trx, id, input.findings, by.id);
    await recordAudit(trx, {
      actorId: by.id,
      action: 'assessment.findings',
      entityType: 'assessment',
      entityId: String(id),
    });
    return { id, version };
  });
}

export async function signOff(by: Caller, id: number, input: { findings: string; version: number }) {
  return withTransaction(db, async (trx) => {
    const a = await lockDraft(trx, id, input.version);
    const p = await proposals.getProposal(trx, a.proposal_id, { lock: true });
    const result = a.result as unknown as StoredResult;
    if (result.blocking.length)
      throw new HttpError('CONFLICT', `This assessment cannot be signed off yet: ${result.blocking.join(' ')}`);
    if (p!.state !== 'in-assessment')
      throw new HttpError('CONFLICT', `Proposal ${p!.reference} is "${p!.state}", not being assessed.`);
    const version = await store.signOff(trx, id, input.findings, by.id);
    await proposals.setState(trx, p!.id, {
      from: p!.state,
      to: 'assessed',
      reason: `Assessment ${a.number} signed off.`,
      by: by.id,
    });
    const mail = (forChair: boolean) => (u: { name: string }) =>
      assessmentSignedMail({
        reference: p!.reference,
        title: p!.title,
        url: proposalUrl(p!.id),
        name: u.name,
        by: by.name,
        number: a.number,
        level: `${result.grade.label} (level ${result.grade.level} of 4)`,
        co2e:
          `${Math.round(result.totals.co2eTotal).toLocaleString('en')} t CO2e (95 % ` +
          `range ${Math.round(result.totals.co2eLow).toLocaleString('en')} to ${Math.round(result.totals.co2eHigh).toLocaleString('en')})`,
        forChair,
      });
    if (p!.created_by) {
      const u = await trx('user').select('name', 'email').where({ id: p!.created_by }).first();
      if (u) await enqueueMail(trx, { to: u.email, ...mail(false)(u) });
    }
    await mailRole(trx, 'chair', mail(true));
    await recordAudit(trx, {
      actorId: by.id,
      action: 'assessment.sign-off',
      entityType: 'assessment',
      entityId: String(id),
      details: {
        proposal: p!.reference,
        number: a.number,
        level: result.grade.level,
        co2eTotal: result.totals.co2eTotal,
      },
    });
    return { id, status: 'signed' as const, version, proposalState: 'assessed' };
  });
}

/** Numbers equal to the last bit; anything else by canonical content. */
function differences(
  stored: unknown,
  again: unknown,
  path = '',
): { path: string; stored: unknown; recomputed: unknown }[] {
  if (typeof stored === 'number' || typeof again === 'number')
    return Object.is(stored, again) ? [] : [{ path, stored, recomputed: again }];
  if (Array.isArray(stored) && Array.isArray(again)) {
    if (stored.length !== again.length) return [{ path, stored: stored.length, recomputed: again.length }];
    return stored.flatMap((s, i) => differences(s, again[i], `${path}[${i}]`));
  }
  if (stored && again && typeof stored === 'object' && typeof again === 'object') {
    const keys = new Set([...Object.keys(stored), ...Object.keys(again)]);
    return [...keys].flatMap((k) =>
      differences(
        (stored as Record<string, unknown>)[k],
        (again as Record<string, unknown>)[k],
        path ? `${path}.${k}` : k,
      ),
    );
  }
  return stored === again || (stored == null && again == null) ? [] : [{ path, stored, recomputed: again }];
}

/** Re-runs an assessment from its frozen requests with its pinned factor-set and rule-set versions. */
export async function reproduceAssessment(id: number) {
  const row = await store.getAssessment(db, id);
  if (!row) throw new HttpError('NOT_FOUND', `No assessment with id ${id}.`);
  const stored = row.result as unknown as StoredResult;
  const inputs = row.inputs as Inputs;
  const set = await loadPublished(db, row.factor_set_id, row.factor_set_version);
  const rules = await loadRuleSet(db, row.rule_set_id ?? undefined, row.rule_set_version ?? undefined);
  const proposal = await proposals.getProposal(db, row.proposal_id);
  const figures = assessmentFigures(
    {
      requests: stored.parcels.map((p) => ({
        parcelId: p.parcelId,
        areaHa: p.areaHa,
        request: p.request as ParcelRequest | null,
      })),
      proposed: proposal!.proposed,
      sharePercent: inputs.sharePercent,
      runs: stored.totals.runs,
      seed: stored.totals.seed,
      compensation: inputs.compensationParcelId
        ? { request: stored.compensationRequest as ParcelRequest | null, note: stored.compensationNote }
        : null,
    },
    set,
  );
  const grade = gradeProposal(stored.facts as GradeFacts, rules.document, rules.ref);
  const again = {
    totals: figures.totals,
    figures: figures.estimates.map(compactFigures),
    alternatives: figures.alternatives,
    grade: { level: grade.level, reasons: grade.reasons },
  };
  const before = {
    totals: stored.totals,
    figures: stored.parcels.map((p) => p.figures),
    alternatives: stored.alternatives,
    grade: { level: stored.grade.level, reasons: stored.grade.reasons },
  };
  const diffs = differences(JSON.parse(JSON.stringify(before)), JSON.parse(JSON.stringify(again)));
  return {
    identical: diffs.length === 0,
    differences: diffs.slice(0, 50),
    factorSet: { id: set.id, version: set.version },
    ruleSet: rules.ref,
  };
}
