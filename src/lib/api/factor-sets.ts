/** Contracts of the factor-set routes (reading for everyone signed in, changing for admins). */
import { z } from 'zod';
import { factorSetDocumentSchema, uncertaintySchema } from '../carbon';
import { defineSpec } from '../http/spec';
import { copyBody, diffResponse, publishNote, setIdParams, setSummarySchema, versionQuery } from './versioned-sets';

const setId = z
  .string()
  .regex(/^[a-z0-9]+(?:-[a-z0-9]+)*$/, 'Use lower-case letters, digits and hyphens, e.g. "national-2027".')
  .min(3)
  .max(60);

const versionSummary = z.object({
  version: z.number().int(),
  status: z.enum(['draft', 'published']),
  publishedAt: z.string().nullable(),
  publishedBy: z.string().nullable(),
  note: z.string().nullable(),
  unconfirmedTables: z.array(z.string()),
});

export const factorSetSummarySchema = setSummarySchema(versionSummary, 'FactorSetSummary');

export const listFactorSets = defineSpec({
  method: 'GET',
  path: '/api/factor-sets',
  tag: 'Factor sets',
  summary: 'List factor sets and their versions',
  access: 'signed-in',
  response: z.object({ items: z.array(factorSetSummarySchema) }),
});

export const getFactorSet = defineSpec({
  method: 'GET',
  path: '/api/factor-sets/{id}',
  tag: 'Factor sets',
  summary:
    'One version of a factor set (newest published unless ?version= or ?version=draft), with confirmations and edit history',
  access: 'signed-in',
  params: setIdParams,
  query: versionQuery,
  response: z.object({
    summary: factorSetSummarySchema,
    version: z.number().int(),
    status: z.enum(['draft', 'published']),
    document: factorSetDocumentSchema,
    edits: z.array(
      z.object({
        version: z.number().int(),
        table: z.string(),
        entry: z.string(),
        before: z.unknown(),
        after: z.unknown(),
        reason: z.string(),
        by: z.string().nullable(),
        at: z.string(),
      }),
    ),
  }),
});

const versionRef = z.string().regex(/^[a-z0-9-]+@\d+$/, 'Write a version as id@number, e.g. ipcc-2006@1.');
export const diffFactorSets = defineSpec({
  method: 'GET',
  path: '/api/factor-sets/diff',
  tag: 'Factor sets',
  summary: 'What differs between two published versions (a=id@version, b=id@version)',
  access: 'signed-in',
  query: z.object({ a: versionRef, b: versionRef }),
  response: diffResponse({ table: z.string(), entry: z.string() }),
});

export const cloneFactorSet = defineSpec({
  method: 'POST',
  path: '/api/factor-sets',
  tag: 'Factor sets',
  summary: 'Copy a published set into a new country-specific (Tier 2) set, as an editable draft',
  access: ['admin'],
  body: copyBody(setId, 'set', 1000),
  response: z.object({ id: z.string(), version: z.number().int() }),
  status: 201,
});

export const startDraft = defineSpec({
  method: 'POST',
  path: '/api/factor-sets/{id}/draft',
  tag: 'Factor sets',
  summary: 'Start a new draft from the newest published version',
  access: ['admin'],
  params: setIdParams,
  response: z.object({ version: z.number().int() }),
  status: 201,
});

export const editDraft = defineSpec({
  method: 'PATCH',
  path: '/api/factor-sets/{id}/draft',
  tag: 'Factor sets',
  summary: 'Change one value of the draft, with a reason',
  access: ['admin'],
  params: setIdParams,
  body: z.object({
    tableKey: z.string().min(1),
    entryKey: z.string().min(1),
    value: z.number().nonnegative('Factor values are never negative.'),
    uncertainty: uncertaintySchema.optional(),
    reason: z
      .string()
      .trim()
      .min(10, 'Give the reason and source of the new value (at least 10 characters).')
      .max(2000),
  }),
  response: null,
  status: 204,
});

export const publishDraft = defineSpec({
  method: 'POST',
  path: '/api/factor-sets/{id}/publish',
  tag: 'Factor sets',
  summary: 'Publish the draft as a new immutable version',
  access: ['admin'],
  params: setIdParams,
  body: z.object({ note: publishNote }),
  response: z.object({ version: z.number().int() }),
});

export const confirmTable = defineSpec({
  method: 'POST',
  path: '/api/factor-sets/{id}/versions/{version}/confirmations',
  tag: 'Factor sets',
  summary: 'Record that a table was checked against the published document',
  access: ['admin'],
  params: z.object({ id: z.string().min(1), version: z.coerce.number().int().positive() }),
  body: z.object({
    tableKey: z.string().min(1),
    document: z.string().trim().min(5).max(300),
    page: z.string().trim().min(1).max(40),
  }),
  response: null,
  status: 204,
});

export const putDefaultSet = defineSpec({
  method: 'PUT',
  path: '/api/settings/default-factor-set',
  tag: 'Factor sets',
  summary: 'Choose the factor set used when a request names none',
  access: ['admin'],
  body: z.object({ id: z.string().min(1) }),
  response: null,
  status: 204,
});
