/** Reference layers: list versions, publish a draft (then every parcel is overlaid with it). */
import { recordAudit } from '../db/audit';
import { recomputeScreening } from './screening';
import { db, withTransaction } from '../db/client';
import { computeOverlay } from '../db/overlay';
import { bumpMapVersion } from '../db/parcels';
import * as layers from '../db/reference-layers';
import { KIND_INFO, legendForAll, REFERENCE_KINDS, type ReferenceKind } from '../gis/reference-kinds';
import { HttpError } from '../http/errors';
import type { Caller } from '../http/handle';

export async function listReferenceLayers() {
  const rows = await layers.listLayerVersions(db);
  const current = new Map((await layers.currentVersions(db)).map((v) => [v.kind, v.id]));
  return {
    kinds: REFERENCE_KINDS.map((kind) => ({
      kind,
      label: KIND_INFO[kind].label,
      allowedClasses: KIND_INFO[kind].classes ? [...KIND_INFO[kind].classes!] : null,
      versions: rows
        .filter((r) => r.kind === kind)
        .map((r) => ({
          id: r.id,
          version: r.version,
          status: r.status,
          current: current.get(kind) === r.id,
          classAttribute: r.class_attribute,
          classes: r.classes,
          featureCount: r.feature_count,
          fileName: r.file_name,
          createdAt: r.created_at.toISOString(),
          createdBy: r.created_by_name,
          publishedAt: r.published_at?.toISOString() ?? null,
          publishedBy: r.published_by_name,
          note: r.note,
        })),
    })),
  };
}

export async function publishLayerVersion(by: Caller, id: number, note: string | null) {
  return withTransaction(db, async (trx) => {
    const v = await layers.getLayerVersion(trx, id, { lock: true });
    if (!v) throw new HttpError('NOT_FOUND', 'No such reference layer version.');
    if (v.status === 'published')
      throw new HttpError(
        'CONFLICT',
        `Version ${v.version} of the ${KIND_INFO[v.kind].label.toLowerCase()} layer is already published.`,
      );
    const current = (await layers.currentVersions(trx)).find((c) => c.kind === v.kind);
    if (current && current.version > v.version)
      throw new HttpError(
        'CONFLICT',
        `Version ${current.version} is newer and already published; upload the layer again to replace it.`,
      );
    await layers.markPublished(trx, id, by.id, note);
    const t0 = performance.now();
    await computeOverlay(trx, { all: true }, [id]);
    const overlayMs = Math.round(performance.now() - t0);
    await bumpMapVersion(trx);
    await recordAudit(trx, {
      actorId: by.id,
      action: 'reference-layer.publish',
      entityType: 'reference-layer',
      entityId: `${v.kind}@${v.version}`,
      details: { note, previous: current?.version ?? null },
    });
    await recomputeScreening(trx, by.id, `${KIND_INFO[v.kind].label} version ${v.version} published`);
    return { id, kind: v.kind, version: v.version, timings: { overlayMs } };
  });
}

/** What the map legend needs: the current version and named, symbolised classes of each kind. */
export async function currentLegend() {
  const current = await layers.currentVersions(db);
  const legends = legendForAll(current.map((c) => ({ kind: c.kind as ReferenceKind, classes: c.classes })));
  return REFERENCE_KINDS.map((kind) => {
    const v = current.find((c) => c.kind === kind);
    return { kind, label: KIND_INFO[kind].label, version: v?.version ?? null, classes: legends.get(kind) ?? {} };
  });
}
