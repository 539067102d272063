/** Contracts of the public register: list, entry, verify, CSV and GeoJSON exports (public), corrections (chair, admin). */
import { z } from 'zod';
import { defineSpec } from '../http/spec';
import { conditionSchema, ENTRY_KINDS, OUTCOMES, registerContentSchema } from '../register/content';

const seqParams = z.object({
  seq: z.coerce
    .number()
    .int()
    .positive('Register entries are numbered 1, 2, 3 ...')
    .max(2 ** 53),
});

export const registerFilterSchema = z.object({
  outcome: z.enum(OUTCOMES).optional(),
  year: z.coerce.number().int().min(2000).max(2100).optional().describe('Year of the decision'),
  risk: z.coerce.number().int().min(1).max(4).optional().describe('Risk level 1-4'),
  areaMin: z.coerce.number().min(0).optional().describe('Smallest total area, ha'),
  areaMax: z.coerce.number().min(0).optional().describe('Largest total area, ha'),
  region: z
    .string()
    .trim()
    .max(100)
    .optional()
    .describe(
      'Accounting region: its key or its name (any case; the start of a name is enough when only one name starts so)',
    ),
  q: z.string().trim().max(100).optional().describe('Words in the proposal reference, title or a parcel reference'),
  current: z.enum(['true', 'false']).optional().describe('Only entries not superseded by a later one'),
});

const head = {
  headSeq: z.number(),
  headHash: z
    .string()
    .nullable()
    .describe('Hash of the newest entry: keep it to check later that nothing before it changed'),
};

export const registerSummarySchema = z.object({
  seq: z.number(),
  hash: z.string(),
  kind: z.enum(ENTRY_KINDS),
  reference: z.string(),
  title: z.string(),
  proposedUse: z.string(),
  outcome: z.enum(OUTCOMES),
  decidedOn: z.string(),
  effectiveDate: z.string(),
  areaHa: z.number(),
  region: z.string().nullable(),
  riskLevel: z.number(),
  riskLabel: z.string(),
  co2eTotal: z.number(),
  co2eLow: z.number(),
  co2eHigh: z.number(),
  parcelReferences: z.array(z.string()),
  conditions: z.number(),
  supersedesSeq: z.number().nullable(),
  supersededBy: z.number().nullable(),
});

export const listRegister = defineSpec({
  method: 'GET',
  path: '/api/register',
  tag: 'Register',
  summary:
    'The public register of decisions, paged on the server; filter by outcome, year, risk level, area, region; sort',
  access: 'public',
  query: registerFilterSchema.extend({
    sort: z.enum(['seq', 'decided', 'area', 'risk', 'co2e', 'reference']).default('seq'),
    dir: z.enum(['asc', 'desc']).default('desc'),
    page: z.coerce.number().int().min(1).max(1_000_000).default(1),
    pageSize: z.coerce.number().int().min(1).max(200).default(25),
  }),
  response: z.object({
    items: z.array(registerSummarySchema),
    total: z.number(),
    page: z.number(),
    pageSize: z.number(),
    ...head,
  }),
});

export const getRegisterEntry = defineSpec({
  method: 'GET',
  path: '/api/register/{seq}',
  tag: 'Register',
  summary:
    'One register entry: its full content (parcels with geometry), hash, the previous hash and what supersedes it',
  access: 'public',
  params: seqParams,
  response: z.object({
    seq: z.number(),
    hash: z.string(),
    prevHash: z.string(),
    supersedesSeq: z.number().nullable(),
    supersededBy: z.number().nullable(),
    createdAt: z.string(),
    content: registerContentSchema,
    memberVotes: z
      .array(z.object({ name: z.string(), choice: z.string() }))
      .nullable()
      .describe(
        'How each member voted (names and choices, never comments) when the authority publishes votes (setting register.votes-public); else null',
      ),
    ...head,
  }),
});

export const verifyRegister = defineSpec({
  method: 'GET',
  path: '/api/register/verify',
  tag: 'Register',
  summary:
    'Recompute the whole hash chain: ok, the number of entries and the first entry that does not match (null when all do)',
  access: 'public',
  response: z.object({
    ok: z.boolean(),
    entries: z.number(),
    firstBrokenEntry: z.number().nullable(),
    problem: z.string().nullable(),
    headHash: z.string().nullable(),
    checkedAt: z.string(),
  }),
});

export const registerCsv = defineSpec({
  method: 'GET',
  path: '/api/register.csv',
  tag: 'Register',
  summary: 'The filtered register as CSV (RFC 4180, UTF-8, header row), streamed',
  access: 'public',
  query: registerFilterSchema,
  response: null,
  responseType: 'text/csv',
});

export const registerGeoJson = defineSpec({
  method: 'GET',
  path: '/api/register.geojson',
  tag: 'Register',
  summary: 'The filtered register as an RFC 7946 GeoJSON FeatureCollection (one Feature per entry, WGS 84), streamed',
  access: 'public',
  query: registerFilterSchema,
  response: null,
  responseType: 'application/geo+json',
});

export const correctRegisterEntry = defineSpec({
  method: 'POST',
  path: '/api/register/{seq}/corrections',
  tag: 'Register',
  summary:
    'Record a correction or an appeal outcome: a new entry that names the one it supersedes (nothing is changed in place)',
  access: ['chair', 'admin'],
  params: seqParams,
  body: z.object({
    kind: z.enum(['correction', 'appeal-outcome']),
    note: z
      .string()
      .trim()
      .min(10, 'Say what is corrected or what the appeal decided (at least 10 characters).')
      .max(4000),
    outcome: z.enum(OUTCOMES).optional(),
    reasons: z.string().trim().min(10).max(10_000).optional(),
    conditions: z.array(conditionSchema).max(50).optional(),
    effectiveDate: z.iso.date().optional(),
  }),
  response: z.object({ seq: z.number(), hash: z.string(), supersedesSeq: z.number(), outcome: z.enum(OUTCOMES) }),
  status: 201,
});

const tileInt = (max: number, what: string) =>
  z
    .string()
    .regex(/^\d{1,7}$/, `${what} must be a whole number.`)
    .transform(Number)
    .refine((n) => n <= max, `${what} is out of range.`);

export const registerTile = defineSpec({
  method: 'GET',
  path: '/api/register/tiles/{z}/{x}/{y}.mvt',
  tag: 'Register',
  summary:
    'Public vector tile (Mapbox Vector Tile) of the register: layer "register" with the parcels of entries in ' +
    'force (seq, outcome, year, risk_level, area_ha; no personal data); ETag = register head',
  access: 'public',
  params: z.object({ z: tileInt(22, 'Zoom'), x: tileInt(2 ** 22 - 1, 'x'), y: tileInt(2 ** 22 - 1, 'y') }),
  query: z.object({
    v: z.coerce
      .number()
      .int()
      .nonnegative()
      .optional()
      .describe('The register head seq the URL was made for (allows long caching)'),
  }),
  response: null,
  responseType: 'application/vnd.mapbox-vector-tile',
});
