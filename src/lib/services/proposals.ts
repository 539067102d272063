/** Proposal use cases: file, edit, move through the states, read, list, attach documents. One transaction each, audited. */
import { checkDocument, storeDocument } from './documents';
import type { Geometry, MultiPolygon } from 'geojson';
import type { z } from 'zod';
import type { proposalFieldsSchema } from '../api/proposals';
import { hasAnyRole } from '../auth/roles';
import { config } from '../config';
import { recordAudit } from '../db/audit';
import { db, withTransaction, type Db } from '../db/client';
import { getGisSettings } from '../db/gis-settings';
import * as store from '../db/proposals';
import { validateFeatures } from '../gis/validate';
import { HttpError } from '../http/errors';
import type { Caller } from '../http/handle';
import { enqueueMail } from '../mail/outbox';
import { proposalReturnedMail, proposalSubmittedMail } from '../mail/templates';
import { checkTransition, daysLeft, EDITABLE_STATES, type ProposalState } from '../proposals/states';
import { validationOptions } from './upload-validate';

type Fields = z.output<typeof proposalFieldsSchema>;
const today = () => new Date().toISOString().slice(0, 10);
export const proposalUrl = (id: number) => `${config().BETTER_AUTH_URL}/proposals/${id}`;
/** Who may read the applicant (private, like a parcel's owner reference). */
export const seesApplicant = (by: Caller) => hasAnyRole(by.roles, ['planner', 'assessor', 'admin']);

/** A drawn part: validated like a drawn parcel; returns it as a MultiPolygon. */
async function checkParts(
  trx: Db,
  parcels: Fields['parcels'],
): Promise<{ parcelId: number; part: MultiPolygon | null }[]> {
  const ids = parcels.map((p) => p.parcelId);
  const dupes = ids.filter((id, i) => ids.indexOf(id) !== i);
  if (dupes.length)
    throw new HttpError(
      'UNPROCESSABLE_CONTENT',
      `Parcel ${dupes[0]} is named twice; name each parcel once (with one part at most).`,
      [{ path: ['parcels'], message: 'duplicate parcel' }],
    );
  const missing = await store.missingParcels(trx, ids);
  if (missing.length)
    throw new HttpError('UNPROCESSABLE_CONTENT', `No parcel with id ${missing.join(', ')} in the register.`, [
      { path: ['parcels'], message: 'unknown parcel' },
    ]);
  const options = validationOptions(await getGisSettings(trx), null, 'parcels');
  return parcels.map((p, i) => {
    if (!p.part) return { parcelId: p.parcelId, part: null };
    const f = validateFeatures([{ geometry: p.part as Geometry, reference: null }], options).features[0]!;
    const errors = f.issues.filter((x) => x.severity === 'error');
    if (f.status === 'rejected' || !f.geometry) {
      throw new HttpError(
        'UNPROCESSABLE_CONTENT',
        `The part drawn on parcel ${p.parcelId} is not valid: ${errors.map((e) => e.message).join(' ')}`,
        errors.map((e) => ({ path: ['parcels', i, 'part'], message: e.message })),
      );
    }
    return { parcelId: p.parcelId, part: f.geometry };
  });
}

async function saveParcels(trx: Db, proposalId: number, parcels: Fields['parcels']): Promise<void> {
  const checked = await checkParts(trx, parcels);
  const { outside } = await store.replaceParcels(trx, proposalId, checked);
  if (outside.length) {
    throw new HttpError(
      'UNPROCESSABLE_CONTENT',
      `The part drawn on parcel ${outside.join(', ')} reaches outside the parcel; draw it inside the parcel's boundary.`,
      [{ path: ['parcels'], message: 'part outside its parcel' }],
    );
  }
}

/** Files a draft. `now` sets the year in the reference (the demo history files past proposals). */
export async function createProposal(by: Caller, input: Fields, now = new Date()) {
  return withTransaction(db, async (trx) => {
    const reference = await store.nextReference(trx, now.getUTCFullYear());
    const id = await store.insertProposal(trx, { ...input, reference, by: by.id });
    await saveParcels(trx, id, input.parcels);
    await store.insertCreatedEvent(trx, id, by.id);
    await recordAudit(trx, {
      actorId: by.id,
      action: 'proposal.create',
      entityType: 'proposal',
      entityId: String(id),
      details: { reference, parcels: input.parcels.length },
    });
    return { id, reference, state: 'draft' as const, version: 1 };
  });
}

/** The locked row, checked against the version the caller read (409 when someone else changed it). */
export async function lockProposal(trx: Db, id: number, version: number): Promise<store.ProposalRow> {
  const p = await store.getProposal(trx, id, { lock: true });
  if (!p) throw new HttpError('NOT_FOUND', `No proposal with id ${id}.`);
  if (p.version !== version) {
    throw new HttpError(
      'CONFLICT',
      `Someone else changed proposal ${p.reference} after you opened it (it is at version ${p.version}, you ` +
        `sent ${version}). Reload it to see their change; nothing was saved.`,
    );
  }
  return p;
}

export async function updateProposal(by: Caller, id: number, input: Partial<Fields> & { version: number }) {
  return withTransaction(db, async (trx) => {
    const p = await lockProposal(trx, id, input.version);
    if (!EDITABLE_STATES.includes(p.state))
      throw new HttpError(
        'CONFLICT',
        `Proposal ${p.reference} is "${p.state}"; only drafts and returned proposals can be changed.`,
      );
    const { version: _v, parcels, ...fields } = input;
    const version = await store.updateProposalFields(trx, id, fields, by.id);
    if (parcels) await saveParcels(trx, id, parcels);
    await recordAudit(trx, {
      actorId: by.id,
      action: 'proposal.update',
      entityType: 'proposal',
      entityId: String(id),
      details: { reference: p.reference, changed: Object.keys(input).filter((k) => k !== 'version') },
    });
    return { id, reference: p.reference, state: p.state, version };
  });
}

/** Mail to everyone who holds a role, in the caller's transaction (the outbox delivers it later). */
export async function mailRole(
  trx: Db,
  role: string,
  make: (u: { name: string }) => { subject: string; text: string; html: string },
): Promise<void> {
  for (const u of await store.usersWithRole(trx, role)) await enqueueMail(trx, { to: u.email, ...make(u) });
}

async function mailCreator(
  trx: Db,
  p: store.ProposalRow,
  make: (u: { name: string }) => { subject: string; text: string; html: string },
): Promise<void> {
  if (!p.created_by) return;
  const u = await trx('user').select('name', 'email').where({ id: p.created_by }).first();
  if (u) await enqueueMail(trx, { to: u.email, ...make(u) });
}

/** Moves a proposal along the state machine, inside an open transaction (shared with the assessment service). */
export async function applyTransition(
  trx: Db,
  by: Caller,
  p: store.ProposalRow,
  to: ProposalState,
  reason: string | undefined,
): Promise<number> {
  const check = checkTransition(p.state, to, by.roles, reason);
  if (!check.ok)
    throw new HttpError(
      check.code,
      check.message,
      check.code === 'UNPROCESSABLE_CONTENT' ? [{ path: ['reason'], message: check.message }] : undefined,
    );
  const settings = await store.getProposalSettings(trx);
  const submitting = to === 'submitted';
  if (submitting && (await store.listParcels(trx, p.id)).length === 0)
    throw new HttpError('CONFLICT', `Proposal ${p.reference} names no parcel; add one before submitting.`);
  const version = await store.setState(trx, p.id, {
    from: p.state,
    to,
    reason: reason?.trim() || null,
    by: by.id,
    submittedAt: submitting,
    decisionDays: settings['proposal.decision-days'],
  });
  const ref = { reference: p.reference, title: p.title, url: proposalUrl(p.id) };
  if (submitting) {
    const due = (await store.getProposal(trx, p.id))!.decision_due!;
    await mailRole(trx, 'assessor', (u) =>
      proposalSubmittedMail({ ...ref, name: u.name, by: by.name, decisionDue: due }),
    );
  }
  if (to === 'returned')
    await mailCreator(trx, p, (u) =>
      proposalReturnedMail({ ...ref, name: u.name, by: by.name, reason: reason!.trim() }),
    );
  await recordAudit(trx, {
    actorId: by.id,
    action: `proposal.${to}`,
    entityType: 'proposal',
    entityId: String(p.id),
    details: { reference: p.reference, from: p.state, to, reason: reason ?? null },
  });
  return version;
}

export async function transitionProposal(
  by: Caller,
  id: number,
  input: { to: ProposalState; version: number; reason?: string },
) {
  return withTransaction(db, async (trx) => {
    const p = await lockProposal(trx, id, input.version);
    const version = await applyTransition(trx, by, p, input.to, input.reason);
    return { id, state: input.to, version };
  });
}

function clock(p: { state: ProposalState; decision_due: string | null }): number | null {
  if (!p.decision_due || ['decided', 'withdrawn', 'draft', 'returned'].includes(p.state)) return null;
  return daysLeft(p.decision_due, today());
}

export async function listProposals(query: store.ListFilter) {
  const { rows, total } = await store.listProposals(db, query);
  return {
    items: rows.map((r) => ({
      id: r.id,
      reference: r.reference,
      title: r.title,
      state: r.state,
      parcelCount: r.parcel_count ?? 0,
      parcelReferences: r.refs ?? [],
      areaHa: Number(r.area_ha ?? 0),
      startYear: r.start_year,
      submittedAt: r.submitted_at?.toISOString() ?? null,
      decisionDue: r.decision_due,
      daysLeft: clock(r),
      riskLevel: r.grade_level,
      riskLabel: r.grade_label,
      co2eTotal: r.co2e_total,
      updatedAt: r.updated_at.toISOString(),
    })),
    total,
    page: query.page,
    pageSize: query.pageSize,
  };
}

export async function proposalDetail(by: Caller, id: number) {
  const p = await store.getProposal(db, id);
  if (!p) throw new HttpError('NOT_FOUND', `No proposal with id ${id}.`);
  const [parcels, history, attachments, assessments] = await Promise.all([
    store.listParcels(db, id),
    store.listEvents(db, id),
    store.listAttachments(db, id),
    db.raw(
      `select a.id::int as id, a.number, a.status, a.version, a.grade_level, a.co2e_total, a.signed_at, u.name as ` +
        `signed_by_name from assessment a left join "user" u on u.id = a.signed_by where a.proposal_id = ? order by a.number desc`,
      [id],
    ),
  ]);
  const latest = assessments.rows[0];
  return {
    id: p.id,
    reference: p.reference,
    title: p.title,
    state: p.state,
    description: p.description,
    proposed: p.proposed,
    version: p.version,
    startYear: p.start_year,
    parcelCount: parcels.length,
    parcelReferences: parcels.map((x) => x.reference),
    areaHa: parcels.reduce((s, x) => s + x.area_ha, 0),
    submittedAt: p.submitted_at?.toISOString() ?? null,
    decisionDue: p.decision_due,
    daysLeft: clock(p),
    riskLevel: latest?.grade_level ?? null,
    riskLabel: null as string | null,
    co2eTotal: latest?.co2e_total ?? null,
    updatedAt: p.updated_at.toISOString(),
    applicant: seesApplicant(by)
      ? { name: p.applicant_name, contact: p.applicant_contact, interest: p.applicant_interest }
      : null,
    parcels: parcels.map((x) => ({
      parcelId: x.parcel_id,
      reference: x.reference,
      name: x.name,
      areaHa: x.area_ha,
      parcelAreaHa: x.parcel_area_ha,
      part: x.part as unknown as Record<string, unknown> | null,
      geometry: x.geometry as unknown as Record<string, unknown>,
    })),
    history: history.map((e) => ({
      from: e.from_state,
      to: e.to_state,
      reason: e.reason,
      by: e.by_name,
      at: e.at.toISOString(),
    })),
    attachments: attachments.map((a) => ({
      id: a.id,
      fileName: a.file_name,
      mediaType: a.media_type,
      sizeBytes: a.size_bytes,
      sha256: a.sha256,
      uploadedBy: a.uploaded_by_name,
      uploadedAt: a.uploaded_at.toISOString(),
    })),
    assessments: (
      assessments.rows as {
        id: number;
        number: number;
        status: 'draft' | 'signed';
        version: number;
        grade_level: number | null;
        co2e_total: number | null;
        signed_at: Date | null;
        signed_by_name: string | null;
      }[]
    ).map((a) => ({
      id: a.id,
      number: a.number,
      status: a.status,
      version: a.version,
      riskLevel: a.grade_level,
      co2eTotal: a.co2e_total,
      signedAt: a.signed_at?.toISOString() ?? null,
      signedBy: a.signed_by_name,
    })),
    createdBy: p.created_by_name,
    createdAt: p.created_at.toISOString(),
  };
}

/** Attachments: planners while the proposal is theirs to edit, assessors while they assess it. */
export async function addAttachment(by: Caller, id: number, file: { fileName: string; bytes: Uint8Array }) {
  const mediaType = await checkDocument(db, file, { plural: 'attachments', added: 'attached', add: 'Attach' });
  return withTransaction(db, async (trx) => {
    const p = await store.getProposal(trx, id, { lock: true });
    if (!p) throw new HttpError('NOT_FOUND', `No proposal with id ${id}.`);
    const plannerMay = hasAnyRole(by.roles, ['planner']) && EDITABLE_STATES.includes(p.state);
    const assessorMay = hasAnyRole(by.roles, ['assessor']) && ['submitted', 'in-assessment'].includes(p.state);
    if (!plannerMay && !assessorMay)
      throw new HttpError(
        'CONFLICT',
        `Documents cannot be attached to proposal ${p.reference} while it is "${p.state}".`,
      );
    return storeDocument(
      trx,
      by,
      file,
      mediaType,
      (row) => store.insertAttachment(trx, { ...row, proposalId: id, by: by.id }),
      {
        action: 'proposal.attach',
        entityType: 'proposal',
        entityId: String(id),
        details: (attachmentId) => ({ reference: p.reference, attachmentId }),
      },
    );
  });
}

export async function readAttachment(id: number, attachmentId: string) {
  const a = await store.getAttachment(db, id, attachmentId);
  if (!a) throw new HttpError('NOT_FOUND', 'No such attachment on this proposal.');
  return a;
}
