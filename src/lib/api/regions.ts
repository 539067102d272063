/** Contracts of the accounting-region routes (figures for the ratio rule; reference ratios entered by admins). */
import { z } from 'zod';
import { defineSpec } from '../http/spec';
import { RULE_READERS } from './rule-sets';

const isoDate = z
  .string()
  .regex(/^\d{4}-\d{2}-\d{2}$/, 'Use a date in the form YYYY-MM-DD.')
  .refine(
    (d) => !Number.isNaN(Date.parse(`${d}T00:00:00Z`)) && new Date(`${d}T00:00:00Z`).toISOString().startsWith(d),
    'Not a calendar date.',
  );
const reference = z.object({
  key: z.string(),
  referenceYear: z.number().int(),
  ratio: z.number(),
  origin: z.enum(['computed', 'entered']),
  source: z.string(),
  enteredBy: z.string().nullable(),
  enteredAt: z.string().nullable(),
});

export const listRegions = defineSpec({
  method: 'GET',
  path: '/api/regions',
  tag: 'Rule sets',
  summary:
    "Each accounting region's agricultural area, permanent grassland and ratio as of a date (default today), with its reference ratio",
  access: RULE_READERS,
  query: z.object({ asOf: isoDate.optional() }),
  response: z.object({
    asOf: z.string(),
    layerVersion: z.number().int().nullable(),
    referenceYear: z.number().int(),
    items: z.array(
      z.object({
        key: z.string(),
        label: z.string(),
        parcels: z.number().int(),
        agriculturalHa: z.number(),
        permanentGrasslandHa: z.number(),
        undecidedHa: z.number(),
        unknownUseHa: z.number(),
        ratio: z.number().nullable(),
        reference: reference.nullable(),
        entered: z.array(
          z.object({
            referenceYear: z.number().int(),
            ratio: z.number(),
            source: z.string(),
            enteredBy: z.string().nullable(),
            enteredAt: z.string(),
          }),
        ),
      }),
    ),
  }),
});

export const enterReferenceRatio = defineSpec({
  method: 'POST',
  path: '/api/regions/{key}/reference-ratio',
  tag: 'Rule sets',
  summary:
    "Enter a region's reference permanent-grassland ratio with its source (used when the land-use history does not cover the reference date)",
  access: ['admin'],
  params: z.object({ key: z.string().min(1).max(100) }),
  body: z.object({
    referenceYear: z.number().int().min(1990).max(2100),
    ratio: z
      .number()
      .gt(0, 'A ratio is above 0.')
      .max(1, 'A ratio is at most 1 (permanent grassland cannot exceed the agricultural area).'),
    source: z.string().trim().min(10, 'Name the document the figure comes from (at least 10 characters).').max(500),
  }),
  response: z.object({ id: z.number().int() }),
  status: 201,
});
