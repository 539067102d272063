/** Runs an estimate against a stored, published factor set (never mixing sets). */
import { canSignOff, estimateLandUseChange, EstimateInputError, tablesUsed, unconfirmedTables } from '../carbon';
import type { z } from 'zod';
import type { estimateBodySchema } from '../api/estimates';
import { db } from '../db/client';
import { HttpError } from '../http/errors';
import { defaultSetId, loadPublished } from './factor-sets';

export async function runEstimate(body: z.output<typeof estimateBodySchema>) {
  const setId = body.factorSet ?? (await defaultSetId(db));
  const set = await loadPublished(db, setId, body.factorSetVersion);
  try {
    const result = estimateLandUseChange({ ...body, factorSet: setId }, set);
    const used = tablesUsed(result.factors);
    const open = new Set(unconfirmedTables(set));
    return { ...result, signOffReady: canSignOff(set, used), unconfirmedTablesUsed: used.filter((t) => open.has(t)) };
  } catch (err) {
    if (err instanceof EstimateInputError) {
      const first = err.issues[0];
      throw new HttpError('UNPROCESSABLE_CONTENT', first ? `${first.path.join('.') || 'request'}: ${first.message}` : err.message, err.issues);
    }
    throw err;
  }
}
