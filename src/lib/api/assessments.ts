/** Contracts of the assessment routes: run (or re-run) the draft, read, list versions, findings, sign-off, reproduce. */
import { z } from 'zod';
import { estimateRequestSchema, GWP_SETS, landUseStateSchema } from '../carbon';
import { defineSpec } from '../http/spec';
import { estimateResponseSchema } from './estimates';

const proposalParams = z.object({
  id: z.coerce
    .number()
    .int()
    .positive()
    .max(2 ** 31 - 1),
});
const idParams = z.object({
  id: z.coerce
    .number()
    .int()
    .positive('Assessment ids are positive whole numbers.')
    .max(2 ** 31 - 1),
});
const rowVersion = z
  .number()
  .int()
  .positive()
  .max(2 ** 31 - 1)
  .describe('The row version you read; a stale one gets 409');
const reason = z.string().trim().min(3, 'Give a reason (at least 3 characters).').max(2000);

export const assessmentInputsSchema = z.object({
  version: rowVersion.optional().describe('When re-running an existing draft: its row version'),
  factorSet: z.string().min(1).max(60).optional().describe("Default: the authority's default factor set"),
  factorSetVersion: z.number().int().positive().optional(),
  gwp: z.enum(GWP_SETS).optional().describe("Default: the authority's GWP setting"),
  overrideReason: reason
    .optional()
    .describe('Required when the factor set or GWP differs from the authority’s default'),
  currentStates: z
    .array(z.object({ parcelId: z.number().int().positive(), state: landUseStateSchema, reason }))
    .max(5000)
    .optional()
    .describe(
      'The current state of parcels whose record does not say it (or that the assessor corrects), each with a reason',
    ),
  sharePercent: z
    .number()
    .int()
    .min(1)
    .max(99)
    .default(50)
    .describe('The share of the area the "convert only part" alternative converts'),
  compensationParcelId: z
    .number()
    .int()
    .positive()
    .optional()
    .describe('A cropland parcel to restore to grassland as compensation'),
  seed: z
    .number()
    .int()
    .min(0)
    .max(2 ** 31 - 1)
    .default(1),
  ruleSet: z.string().min(1).max(60).optional(),
  ruleSetVersion: z.number().int().positive().optional(),
  reason: z
    .string()
    .trim()
    .max(2000)
    .optional()
    .describe('Why a signed assessment is re-opened (kept in the proposal history)'),
});

const range = { co2eLow: z.number(), co2eHigh: z.number() };
const reasonSchema = z.object({
  rule: z.string(),
  citation: z.string(),
  text: z.string(),
  level: z.number(),
  gate: z.boolean(),
});

export const assessmentSchema = z
  .object({
    id: z.number(),
    proposalId: z.number(),
    number: z.number().describe('Assessment version of the proposal: 1, 2, ...'),
    version: z.number().describe('Row version (send it back with sign-off)'),
    status: z.enum(['draft', 'signed']),
    totals: z.object({
      areaHa: z.number(),
      socChangeTotal: z.number(),
      biomassChangeTotal: z.number(),
      n2oTotal: z.number(),
      co2eTotal: z.number(),
      ...range,
      runs: z.number(),
      seed: z.number(),
    }),
    parcels: z.array(
      z.object({
        parcelId: z.number(),
        reference: z.string(),
        areaHa: z.number(),
        part: z.boolean(),
        request: estimateRequestSchema
          .safeExtend({ factorSetVersion: z.number() })
          .nullable()
          .describe('The exact POST /api/estimates body used for this parcel'),
        estimate: estimateResponseSchema.nullable().describe('Exactly what POST /api/estimates returns for `request`'),
        currentState: z.object({ source: z.enum(['record', 'assessor']), note: z.string() }),
        overlay: z.object({
          climate: z.string().nullable(),
          soils: z.array(z.object({ type: z.string(), fraction: z.number() })),
          flags: z.array(z.string()),
        }),
        problems: z.array(z.string()).describe('What blocks sign-off for this parcel (never guessed)'),
      }),
    ),
    grade: z.object({
      level: z.number().int().min(1).max(4),
      label: z.string(),
      shape: z.string(),
      reasons: z.array(reasonSchema),
      ruleSet: z.object({ id: z.string(), version: z.number() }),
    }),
    alternatives: z.array(
      z.object({
        key: z.string(),
        label: z.string(),
        description: z.string(),
        available: z.boolean(),
        note: z.string().nullable(),
        areaHa: z.number(),
        co2eTotal: z.number().nullable(),
        ...{ co2eLow: z.number().nullable(), co2eHigh: z.number().nullable() },
        differenceFromProposal: z.number().nullable(),
      }),
    ),
    plausibility: z.object({
      applicable: z.boolean(),
      lossShare: z.number().nullable(),
      band: z.object({ low: z.number(), high: z.number() }),
      inBand: z.boolean().nullable(),
      studies: z.array(z.string()),
      message: z.string(),
    }),
    cautions: z.array(z.string()),
    blocking: z.array(z.string()).describe('Why sign-off is refused now; empty when it may be signed'),
    signOffReady: z.boolean(),
    unconfirmedTablesUsed: z.array(z.string()),
    factorSet: z.object({ id: z.string(), version: z.number() }),
    gwp: z.string(),
    facts: z.record(z.string(), z.unknown()).describe('The facts the rules read (holding references left out)'),
    findings: z.string().nullable(),
    signedBy: z.string().nullable(),
    signedAt: z.string().nullable(),
    createdBy: z.string().nullable(),
    createdAt: z.string(),
    updatedAt: z.string(),
  })
  .meta({ id: 'Assessment' });

export const runAssessment = defineSpec({
  method: 'POST',
  path: '/api/proposals/{id}/assessment',
  tag: 'Assessments',
  summary:
    'Start or re-run the draft assessment: every parcel estimated from its overlay and state, joint Monte Carlo range, grade, alternatives, plausibility',
  access: ['assessor'],
  params: proposalParams,
  body: assessmentInputsSchema,
  response: assessmentSchema,
});

export const listAssessments = defineSpec({
  method: 'GET',
  path: '/api/proposals/{id}/assessments',
  tag: 'Assessments',
  summary: 'Every assessment version of a proposal, newest first',
  access: 'signed-in',
  params: proposalParams,
  response: z.object({
    items: z.array(
      z.object({
        id: z.number(),
        number: z.number(),
        status: z.enum(['draft', 'signed']),
        version: z.number(),
        riskLevel: z.number().nullable(),
        riskLabel: z.string().nullable(),
        co2eTotal: z.number().nullable(),
        factorSet: z.string(),
        ruleSet: z.string().nullable(),
        signedBy: z.string().nullable(),
        signedAt: z.string().nullable(),
        createdAt: z.string(),
      }),
    ),
  }),
});

export const getAssessment = defineSpec({
  method: 'GET',
  path: '/api/assessments/{id}',
  tag: 'Assessments',
  summary: 'One assessment version in full',
  access: 'signed-in',
  params: idParams,
  response: assessmentSchema,
});

export const saveFindings = defineSpec({
  method: 'PATCH',
  path: '/api/assessments/{id}',
  tag: 'Assessments',
  summary: 'Save the findings text of a draft (send the version you read)',
  access: ['assessor'],
  params: idParams,
  body: z.object({ findings: z.string().trim().max(20_000), version: rowVersion }),
  response: z.object({ id: z.number(), version: z.number() }),
});

export const signOffAssessment = defineSpec({
  method: 'POST',
  path: '/api/assessments/{id}/sign-off',
  tag: 'Assessments',
  summary:
    'Sign the draft off: freezes inputs, overlay, factor-set and rule-set versions and every output; the proposal becomes assessed',
  access: ['assessor'],
  params: idParams,
  body: z.object({
    findings: z.string().trim().min(10, 'Write the findings (at least 10 characters) before signing off.').max(20_000),
    version: rowVersion,
  }),
  response: z.object({ id: z.number(), status: z.literal('signed'), version: z.number(), proposalState: z.string() }),
});

export const reproduceAssessment = defineSpec({
  method: 'GET',
  path: '/api/assessments/{id}/reproduce',
  tag: 'Assessments',
  summary:
    'Re-run an assessment from its frozen inputs with its pinned factor-set and rule-set versions, and say whether every figure comes out identical',
  access: 'signed-in',
  params: idParams,
  response: z.object({
    identical: z.boolean(),
    differences: z.array(z.object({ path: z.string(), stored: z.unknown(), recomputed: z.unknown() })),
    factorSet: z.object({ id: z.string(), version: z.number() }),
    ruleSet: z.object({ id: z.string(), version: z.number() }),
  }),
});
