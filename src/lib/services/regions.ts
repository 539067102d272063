/** Accounting regions: figures and reference ratios for assessors and admins; admins enter reference ratios. */
import { recordAudit } from '../db/audit';
import { db, withTransaction, type Db } from '../db/client';
import * as regions from '../db/regions';
import { HttpError } from '../http/errors';
import type { Caller } from '../http/handle';

export async function regionOverview(asOf: string, conn: Db = db) {
  const [{ layerVersion }, stats, year] = await Promise.all([
    regions.regionList(conn),
    regions.regionStats(conn, asOf),
    regions.referenceYear(conn),
  ]);
  const items = [];
  for (const s of stats) {
    items.push({
      ...s,
      ratio: s.agriculturalHa > 0 ? s.permanentGrasslandHa / s.agriculturalHa : null,
      reference: await regions.referenceRatio(conn, s.key),
      entered: await regions.listEnteredRatios(conn, s.key),
    });
  }
  return { asOf, layerVersion, referenceYear: year, items };
}

export async function enterReferenceRatio(
  by: Caller,
  key: string,
  input: { referenceYear: number; ratio: number; source: string },
): Promise<{ id: number }> {
  return withTransaction(db, async (trx) => {
    const { regions: known } = await regions.regionList(trx);
    if (!known.some((r) => r.key === key))
      throw new HttpError('NOT_FOUND', `No accounting region "${key}" in the current region layer.`);
    const id = await regions.insertReferenceRatio(trx, { key, ...input, by: by.id });
    await recordAudit(trx, {
      actorId: by.id,
      action: 'region.reference-ratio',
      entityType: 'region',
      entityId: key,
      details: input,
    });
    return { id };
  });
}
