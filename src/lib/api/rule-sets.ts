/** Contracts of the rule-set routes (reading for assessors, board, chair and admins; changing for admins). */
import { z } from 'zod';
import type { Role } from '../auth/roles';
import { defineSpec } from '../http/spec';
import { copyBody, diffResponse, publishNote, setIdParams, setSummarySchema, versionQuery } from './versioned-sets';
import { ruleSchema, ruleSetDocumentSchema, ruleSetIdSchema } from '../rules';

export const RULE_READERS: readonly Role[] = ['assessor', 'board', 'chair', 'admin'];
const revision = z.number().int().positive();

const versionSummary = z.object({
  version: z.number().int(),
  status: z.enum(['draft', 'published']),
  revision: z.number().int(),
  ruleCount: z.number().int(),
  publishedAt: z.string().nullable(),
  publishedBy: z.string().nullable(),
  note: z.string().nullable(),
});

export const ruleSetSummarySchema = setSummarySchema(versionSummary, 'RuleSetSummary');

export const listRuleSets = defineSpec({
  method: 'GET',
  path: '/api/rule-sets',
  tag: 'Rule sets',
  summary: 'List rule sets and their versions',
  access: RULE_READERS,
  response: z.object({ items: z.array(ruleSetSummarySchema) }),
});

export const getRuleSet = defineSpec({
  method: 'GET',
  path: '/api/rule-sets/{id}',
  tag: 'Rule sets',
  summary: 'One version of a rule set (newest published unless ?version= or ?version=draft), with the edit history',
  access: RULE_READERS,
  params: setIdParams,
  query: versionQuery,
  response: z.object({
    summary: ruleSetSummarySchema,
    version: z.number().int(),
    status: z.enum(['draft', 'published']),
    revision: z.number().int(),
    document: ruleSetDocumentSchema,
    edits: z.array(
      z.object({
        version: z.number().int(),
        rule: z.string(),
        action: z.enum(['put', 'remove']),
        before: z.unknown(),
        after: z.unknown(),
        reason: z.string(),
        by: z.string().nullable(),
        at: z.string(),
      }),
    ),
  }),
});

const versionRef = z
  .string()
  .regex(/^[a-z0-9-]+@(\d+|draft)$/, 'Write a version as id@number or id@draft, e.g. tarrow-screening@1.');
export const diffRuleSets = defineSpec({
  method: 'GET',
  path: '/api/rule-sets/diff',
  tag: 'Rule sets',
  summary: 'What differs between two versions, rule by rule (a=id@version, b=id@version or id@draft)',
  access: RULE_READERS,
  query: z.object({ a: versionRef, b: versionRef }),
  response: diffResponse({ rule: z.string() }),
});

export const cloneRuleSet = defineSpec({
  method: 'POST',
  path: '/api/rule-sets',
  tag: 'Rule sets',
  summary: 'Copy a published rule set into a new set, as an editable draft',
  access: ['admin'],
  body: copyBody(ruleSetIdSchema, 'rule set', 2000),
  response: z.object({ id: z.string(), version: z.number().int(), revision }),
  status: 201,
});

export const startRuleDraft = defineSpec({
  method: 'POST',
  path: '/api/rule-sets/{id}/draft',
  tag: 'Rule sets',
  summary: 'Start a new draft from the newest published version',
  access: ['admin'],
  params: setIdParams,
  response: z.object({ version: z.number().int(), revision }),
  status: 201,
});

const reason = z
  .string()
  .trim()
  .min(10, 'Give the reason for the change and its source (at least 10 characters).')
  .max(2000);
export const editRuleDraft = defineSpec({
  method: 'PATCH',
  path: '/api/rule-sets/{id}/draft',
  tag: 'Rule sets',
  summary: 'Add, replace or remove one rule of the draft, with a reason; send the revision you read (stale → 409)',
  access: ['admin'],
  params: setIdParams,
  body: z.discriminatedUnion('action', [
    z.object({ action: z.literal('put'), ruleId: z.string().min(1).max(60), rule: ruleSchema, reason, revision }),
    z.object({ action: z.literal('remove'), ruleId: z.string().min(1).max(60), reason, revision }),
  ]),
  response: z.object({ version: z.number().int(), revision }),
});

export const publishRuleDraft = defineSpec({
  method: 'POST',
  path: '/api/rule-sets/{id}/publish',
  tag: 'Rule sets',
  summary: 'Publish the draft as a new immutable version; send the revision you read (stale → 409)',
  access: ['admin'],
  params: setIdParams,
  body: z.object({ note: publishNote, revision }),
  response: z.object({ version: z.number().int() }),
});

export const putDefaultRuleSet = defineSpec({
  method: 'PUT',
  path: '/api/settings/default-rule-set',
  tag: 'Rule sets',
  summary: 'Choose the rule set assessments grade with when none is named',
  access: ['admin'],
  body: z.object({ id: z.string().min(1) }),
  response: null,
  status: 204,
});
