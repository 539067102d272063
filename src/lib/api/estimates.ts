/** Contract of the calculation route. */
import { z } from 'zod';
import { estimateRequestSchema, estimateResultSchema } from '../carbon';
import { defineSpec } from '../http/spec';

export const estimateBodySchema = estimateRequestSchema.safeExtend({
  /** Pin a version of the set (default: its newest published version). */
  factorSetVersion: z.number().int().positive().optional(),
});

export const estimateResponseSchema = estimateResultSchema
  .safeExtend({
    /** True when every table the estimate used is confirmed against its source, so an assessment built on it may be signed off. */
    signOffReady: z.boolean(),
    unconfirmedTablesUsed: z.array(z.string()),
  })
  .meta({ id: 'Estimate' });

export const createEstimate = defineSpec({
  method: 'POST',
  path: '/api/estimates',
  tag: 'Carbon',
  summary: 'IPCC Tier 1 estimate of a land-use or management change (soil carbon, biomass, N2O, CO2e, uncertainty)',
  access: 'signed-in',
  body: estimateBodySchema,
  response: estimateResponseSchema,
});
