/** Contracts of the screening map: the sortable table and a recomputation on request. */
import { z } from 'zod';
import { defineSpec } from '../http/spec';

export const listScreening = defineSpec({
  method: 'GET',
  path: '/api/screening',
  tag: 'Screening',
  summary:
    'Every permanent-grassland parcel with the level and CO2e that converting it to full-tillage cropland would get (paged, sortable)',
  access: 'signed-in',
  query: z.object({
    level: z.coerce.number().int().min(1).max(4).optional(),
    region: z.string().trim().max(60).optional(),
    sort: z.enum(['reference', 'area', 'level', 'co2e', 'high', 'loss']).default('level'),
    dir: z.enum(['asc', 'desc']).default('desc'),
    page: z.coerce.number().int().min(1).max(100_000).default(1),
    pageSize: z.coerce.number().int().min(1).max(500).default(50),
  }),
  response: z.object({
    run: z
      .object({
        computedAt: z.string(),
        by: z.string().nullable(),
        reason: z.string(),
        factorSet: z.string(),
        ruleSet: z.string(),
        layers: z.record(z.string(), z.number()),
        parcelsScreened: z.number(),
        durationMs: z.number(),
        parcelsChangedSince: z.boolean(),
      })
      .nullable(),
    items: z.array(
      z.object({
        parcelId: z.number(),
        reference: z.string(),
        areaHa: z.number(),
        level: z.number().nullable(),
        label: z.string().nullable(),
        co2eTotal: z.number().nullable(),
        co2eHigh: z.number().nullable(),
        socLossPerHa: z.number().nullable(),
        rules: z.array(z.string()),
        problem: z.string().nullable(),
      }),
    ),
    total: z.number(),
    page: z.number(),
    pageSize: z.number(),
  }),
});

export const recomputeScreening = defineSpec({
  method: 'POST',
  path: '/api/screening/recompute',
  tag: 'Screening',
  summary:
    'Recompute the screening map now (it is recomputed by itself when a factor set, rule set or reference layer is published)',
  access: ['assessor', 'admin'],
  response: z.object({ screened: z.number(), ms: z.number() }),
});
