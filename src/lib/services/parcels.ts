/** Parcel use cases: detail for the side panel, drawing a new parcel, editing a boundary, recording history. */
import { uploadName } from '../gis/upload-name';
import type { Geometry, MultiPolygon } from 'geojson';
import { hasAnyRole } from '../auth/roles';
import { recordAudit } from '../db/audit';
import { db, withTransaction, type Db } from '../db/client';
import { getGisSettings } from '../db/gis-settings';
import { computeOverlay, overlayOfParcel } from '../db/overlay';
import * as parcels from '../db/parcels';
import { currentVersions } from '../db/reference-layers';
import { lockParcelRegister } from '../db/parcel-integrity';
import { readChoice } from '../gis/field-mapping';
import { checkLandUseEvent, cultivationMark, EVENT_VALUES } from '../gis/land-use-events';
import { referenceKey, referenceProblem } from '../gis/references';
import { overlapTolerance } from '../gis/settings';
import { deriveLandUseFlags, type LandUseEvent } from '../gis/land-use-history';
import { summariseOverlay } from '../gis/overlay-summary';
import { runGisTask } from '../workers/pool';
import { HttpError } from '../http/errors';
import type { Caller } from '../http/handle';
import { reverseBrokenCompensation } from './compensation';
import { checkBoundaryAgainstRegister } from './parcel-integrity';
import { assertInsideTerritory } from './territory';
import { validationOptions } from './upload-validate';

const today = () => new Date().toISOString().slice(0, 10);

export async function parcelDetail(by: Caller, id: number) {
  const p = await parcels.getParcel(db, id);
  if (!p) throw new HttpError('NOT_FOUND', `No parcel with id ${id}.`);
  const [events, overlay, settings] = await Promise.all([
    parcels.listEvents(db, id),
    overlayOfParcel(db, id),
    getGisSettings(db),
  ]);
  const asOf = today();
  const flags = deriveLandUseFlags(
    events.map((e): LandUseEvent => ({ date: e.event_date, kind: e.kind, value: e.value, cultivation: e.cultivation })),
    {
      asOf,
      permanentGrasslandYears: settings['land-use.permanent-grassland-years'],
      uncultivatedYears: settings['land-use.uncultivated-years'],
      tillageEndsGrassland: settings['land-use.tillage-ends-grassland'],
    },
  );
  const seesOwner = hasAnyRole(by.roles, ['planner', 'admin']);
  return {
    id: p.id,
    reference: p.reference,
    name: p.name,
    areaHa: p.area_ha,
    statedAreaHa: p.stated_area_ha,
    landUse: p.land_use,
    management: p.management,
    ownerRef: seesOwner ? p.owner_ref : null,
    geometry: p.geometry,
    version: p.version,
    source: p.batch_id
      ? {
          kind: 'upload' as const,
          fileName: p.batch_file_name ? uploadName(p.batch_file_name) : null,
          savedAt: p.batch_saved_at?.toISOString() ?? null,
        }
      : { kind: 'drawn' as const, fileName: null, savedAt: p.created_at.toISOString() },
    flags: { asOf, ...flags },
    overlay: summariseOverlay(overlay),
    history: events.map((e) => ({
      id: e.id,
      date: e.event_date,
      kind: e.kind,
      value: e.value,
      cultivation: e.cultivation,
      evidence: e.evidence,
      recordedBy: e.recorded_by_name,
      recordedAt: e.recorded_at.toISOString(),
    })),
    proposals: [] as { id: string; title: string; status: string }[],
  };
}

/**
 * Same checks as an upload (pure validation, territory, register duplicates, overlaps and near-duplicates
 * with the tolerances of the settings), under the register lock; returns the normalised
 * geometry and the warnings (overlaps within the tolerance).
 */
async function checkBoundary(
  trx: Db,
  geometry: Geometry,
  reference: string,
  exceptId?: number,
): Promise<{ geometry: MultiPolygon; warnings: string[] }> {
  await lockParcelRegister(trx);
  const settings = await getGisSettings(trx);
  const report = await runGisTask('validate', {
    features: [{ geometry, reference }],
    options: validationOptions(settings, null, 'parcels'),
  });
  const f = report.features[0]!;
  const errors = f.issues.filter((i) => i.severity === 'error');
  if (f.status === 'rejected' || !f.geometry) {
    throw new HttpError(
      'UNPROCESSABLE_CONTENT',
      `The boundary is not valid: ${errors.map((e) => e.message).join(' ')}`,
      errors.map((e) => ({ path: ['geometry'], message: e.message })),
    );
  }
  await assertInsideTerritory(trx, f.geometry);
  const twin = await parcels.sameBoundary(trx, f.geometry, exceptId);
  if (twin) throw new HttpError('CONFLICT', `Parcel ${twin} already has exactly this boundary.`);
  const warnings = await checkBoundaryAgainstRegister(trx, f.geometry, overlapTolerance(settings), exceptId);
  return { geometry: f.geometry, warnings };
}

/** A land-use or management value from the same list as the events route (value or label, any case); 422 otherwise. */
function checkedChoice(
  value: string | undefined,
  kind: 'land-use' | 'management',
  field: 'landUse' | 'management',
): string | null {
  const r = readChoice(value, kind);
  if (r.bad)
    throw new HttpError(
      'UNPROCESSABLE_CONTENT',
      `Invalid body (${field}): "${value}" is not on the list; choose one of: ${Object.keys(EVENT_VALUES[kind]).join(', ')}.`,
      [{ path: [field], message: 'not on the list' }],
    );
  return r.value;
}

async function overlayAndBump(trx: Db, parcelId: number): Promise<void> {
  await computeOverlay(
    trx,
    { parcelIds: [parcelId] },
    (await currentVersions(trx)).map((v) => v.id),
  );
  await parcels.bumpMapVersion(trx);
}

export async function drawParcel(
  by: Caller,
  input: {
    reference: string;
    name?: string;
    geometry: Geometry;
    landUse?: string;
    management?: string;
    evidence: string;
  },
) {
  const problem = referenceProblem(input.reference);
  if (problem) throw new HttpError('UNPROCESSABLE_CONTENT', problem, [{ path: ['reference'], message: problem }]);
  const choices = [
    ['land-use', checkedChoice(input.landUse, 'land-use', 'landUse')],
    ['management', checkedChoice(input.management, 'management', 'management')],
  ] as const;
  const key = referenceKey(input.reference);
  return withTransaction(db, async (trx) => {
    const { geometry, warnings } = await checkBoundary(trx, input.geometry, input.reference);
    const taken = await parcels.referenceTaken(trx, key);
    if (taken)
      throw new HttpError(
        'CONFLICT',
        `Parcel reference "${input.reference}" is already in the register${taken !== input.reference ? ` as "${taken}"` : ''}.`,
      );
    const id = await parcels.insertDrawnParcel(trx, {
      reference: input.reference,
      referenceKey: key,
      name: input.name ?? null,
      geometry,
      by: by.id,
    });
    for (const [kind, value] of choices) {
      if (value)
        await parcels.insertEvent(trx, {
          parcelId: id,
          date: today(),
          kind,
          value,
          cultivation: false,
          evidence: input.evidence,
          by: by.id,
        });
    }
    await parcels.refreshCurrentState(trx, id, by.id);
    await overlayAndBump(trx, id);
    await recordAudit(trx, {
      actorId: by.id,
      action: 'parcel.draw',
      entityType: 'parcel',
      entityId: String(id),
      details: { reference: input.reference, warnings },
    });
    return { id, warnings };
  });
}

export async function editBoundary(
  by: Caller,
  id: number,
  input: { geometry: Geometry; version: number; reason: string },
) {
  return withTransaction(db, async (trx) => {
    const before = await parcels.getParcel(trx, id);
    if (!before) throw new HttpError('NOT_FOUND', `No parcel with id ${id}.`);
    if (before.version !== input.version)
      throw new HttpError(
        'CONFLICT',
        `Parcel ${before.reference} was changed by someone else (version ${before.version}, you edited ${input.version}); reload it.`,
      );
    const { geometry, warnings } = await checkBoundary(trx, input.geometry, before.reference, id);
    await parcels.updateBoundary(trx, id, geometry, by.id);
    await overlayAndBump(trx, id);
    const after = await parcels.getParcel(trx, id);
    await recordAudit(trx, {
      actorId: by.id,
      action: 'parcel.edit-boundary',
      entityType: 'parcel',
      entityId: String(id),
      details: {
        reference: before.reference,
        reason: input.reason,
        areaHaBefore: before.area_ha,
        areaHaAfter: after!.area_ha,
        geometryBefore: before.geometry,
        warnings,
      },
    });
    return { id, version: after!.version, areaHa: after!.area_ha, warnings };
  });
}

/** Records one dated event after the shared checks (date 1900..today, value valid for the kind, evidence); 422 names the field. */
export async function recordEvent(
  by: Caller,
  id: number,
  e: { date: string; kind: LandUseEvent['kind']; value?: string; cultivation: boolean; evidence: string },
) {
  const value = e.value?.trim().toLowerCase() || null;
  const issues = checkLandUseEvent({ ...e, value }, today());
  if (issues.length)
    throw new HttpError('UNPROCESSABLE_CONTENT', `Invalid body (${issues[0]!.path[0]}): ${issues[0]!.message}`, issues);
  const cultivation = cultivationMark(e.kind, value, e.cultivation);
  return withTransaction(db, async (trx) => {
    const p = await parcels.getParcel(trx, id);
    if (!p) throw new HttpError('NOT_FOUND', `No parcel with id ${id}.`);
    const eventId = await parcels.insertEvent(trx, {
      parcelId: id,
      date: e.date,
      kind: e.kind,
      value,
      cultivation,
      evidence: e.evidence,
      by: by.id,
    });
    await parcels.refreshCurrentState(trx, id, by.id);
    await parcels.bumpMapVersion(trx);
    await recordAudit(trx, {
      actorId: by.id,
      action: 'parcel.record-event',
      entityType: 'parcel',
      entityId: String(id),
      details: {
        eventId,
        reference: p.reference,
        date: e.date,
        kind: e.kind,
        value,
        cultivation,
        evidence: e.evidence,
      },
    });
    // Ploughing a compensation parcel within its permanence period reverses its credited gain, in this transaction.
    const reversedBy = await reverseBrokenCompensation(trx, by, {
      parcelId: id,
      eventId,
      date: e.date,
      kind: e.kind,
      value,
    });
    return { id: eventId, ...(reversedBy.length ? { compensationReversedBy: reversedBy } : {}) };
  });
}
