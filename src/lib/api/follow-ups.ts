/** Contracts of the follow-up tasks that board decisions leave, and of their evidence files. */
import { z } from 'zod';
import { OUTCOMES, TASK_KINDS, TASK_STATUSES } from '../follow-ups/settings';
import { defineSpec } from '../http/spec';

/** Who reads follow-ups: the people who check and decide. Planners see decisions through their proposals. */
export const FOLLOW_UP_READERS = ['assessor', 'board', 'chair', 'admin'] as const;
/** Who records outcomes and evidence: assessors (field checks), the chair (board matters) and admins (as clerk). */
export const FOLLOW_UP_WRITERS = ['assessor', 'chair', 'admin'] as const;

const idParams = z.object({
  id: z.coerce
    .number()
    .int()
    .positive('Task ids are positive whole numbers.')
    .max(2 ** 31 - 1),
});
const evidence = z.object({
  id: z.string(),
  fileName: z.string(),
  mediaType: z.string(),
  sizeBytes: z.number(),
  sha256: z.string(),
  uploadedBy: z.string().nullable(),
  uploadedAt: z.string(),
});

export const followUpSchema = z.object({
  id: z.number(),
  proposalId: z.number(),
  reference: z.string(),
  proposalTitle: z.string(),
  decisionId: z.number().nullable(),
  registerSeq: z.number().nullable(),
  kind: z.enum(TASK_KINDS),
  title: z.string(),
  dueDate: z.string(),
  checkedBy: z.string(),
  assigneeRole: z.enum(['assessor', 'chair']),
  status: z.enum(TASK_STATUSES),
  overdue: z.boolean().describe('Open and past its due date'),
  outcomeNote: z.string().nullable(),
  outcomeBy: z.string().nullable(),
  outcomeAt: z.string().nullable(),
  version: z.number(),
  createdAt: z.string(),
  evidence: z.array(evidence),
});

export const listFollowUps = defineSpec({
  method: 'GET',
  path: '/api/follow-ups',
  tag: 'Follow-ups',
  summary:
    'Follow-up tasks of board decisions, open overdue ones first; filter by status, overdue, proposal reference; paged',
  access: FOLLOW_UP_READERS,
  query: z.object({
    status: z.enum(TASK_STATUSES).optional(),
    overdue: z
      .enum(['true', 'false'])
      .optional()
      .describe('true: only open tasks past their due date; false: all others'),
    reference: z.string().trim().min(1).max(60).optional().describe('Part of the proposal reference'),
    page: z.coerce.number().int().min(1).max(100_000).default(1),
    pageSize: z.coerce.number().int().min(1).max(200).default(25),
  }),
  response: z.object({
    items: z.array(followUpSchema),
    total: z.number(),
    page: z.number(),
    pageSize: z.number(),
    overdueOpen: z.number(),
    today: z.string(),
  }),
});

export const getFollowUp = defineSpec({
  method: 'GET',
  path: '/api/follow-ups/{id}',
  tag: 'Follow-ups',
  summary: 'One follow-up task with its outcome and evidence files',
  access: FOLLOW_UP_READERS,
  params: idParams,
  response: followUpSchema,
});

export const recordFollowUpOutcome = defineSpec({
  method: 'POST',
  path: '/api/follow-ups/{id}/outcome',
  tag: 'Follow-ups',
  summary:
    'Record the outcome of a follow-up task (send the version you read; 409 when someone else recorded one meanwhile)',
  access: FOLLOW_UP_WRITERS,
  params: idParams,
  body: z.object({
    outcome: z.enum(OUTCOMES),
    note: z.string().max(4000).default('').describe('What was found; required unless done'),
    version: z
      .number()
      .int()
      .positive()
      .max(2 ** 31 - 1),
  }),
  response: followUpSchema,
});

export const addFollowUpEvidence = defineSpec({
  method: 'POST',
  path: '/api/follow-ups/{id}/evidence',
  tag: 'Follow-ups',
  summary:
    'Add an evidence file (multipart, field "file"; PDF, PNG or JPEG, checked by content; the attachment size limit applies)',
  access: FOLLOW_UP_WRITERS,
  params: idParams,
  multipart: true,
  response: evidence,
  status: 201,
});

export const getFollowUpEvidence = defineSpec({
  method: 'GET',
  path: '/api/follow-ups/{id}/evidence/{evidenceId}',
  tag: 'Follow-ups',
  summary: 'Download an evidence file (as an attachment, with its SHA-256 in Repr-Digest)',
  access: FOLLOW_UP_READERS,
  params: idParams.extend({ evidenceId: z.uuid('Evidence ids are UUIDs.') }),
  response: null,
  responseType: 'application/octet-stream',
});
