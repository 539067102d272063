/** Runs an estimate against a stored, published factor set (never mixing sets). */
import {
  canSignOff,
  estimateLandUseChange,
  EstimateInputError,
  tablesUsed,
  unconfirmedTables,
  type FactorSetDocument,
} from '../carbon';
import type { z } from 'zod';
import type { estimateBodySchema } from '../api/estimates';
import { db } from '../db/client';
import { HttpError } from '../http/errors';
import { resolvePublished } from './factor-sets';

export type EstimateBody = z.output<typeof estimateBodySchema>;

/** What `POST /api/estimates` answers for `body`, computed with the already loaded `set`. */
export function estimateWithSet(body: EstimateBody & { factorSet: string }, set: FactorSetDocument) {
  const result = estimateLandUseChange(body, set);
  const used = tablesUsed(result.factors);
  const open = new Set(unconfirmedTables(set));
  return { ...result, signOffReady: canSignOff(set, used), unconfirmedTablesUsed: used.filter((t) => open.has(t)) };
}

export function asHttpError(err: unknown): unknown {
  if (err instanceof EstimateInputError) {
    const first = err.issues[0];
    return new HttpError(
      'UNPROCESSABLE_CONTENT',
      first ? `${first.path.join('.') || 'request'}: ${first.message}` : err.message,
      err.issues,
    );
  }
  return err;
}

export async function runEstimate(body: EstimateBody) {
  const set = await resolvePublished(db, body.factorSet, body.factorSetVersion);
  try {
    return estimateWithSet({ ...body, factorSet: set.id }, set);
  } catch (err) {
    throw asHttpError(err);
  }
}
