/** Contracts of the board routes: meetings and agendas, conflicts of interest, votes, decisions. */
import { z } from 'zod';
import { DECISION_OUTCOMES, VOTE_CHOICES } from '../board/settings';
import { defineSpec } from '../http/spec';
import { conditionSchema } from '../register/content';

const id = z.coerce
  .number()
  .int()
  .positive()
  .max(2 ** 31 - 1);
const meetingParams = z.object({ id });
const itemParams = z.object({ id, itemId: id });

const itemSchema = z.object({
  id: z.number(),
  position: z.number(),
  status: z.enum(['listed', 'decided', 'deferred', 'withdrawn']),
  proposalId: z.number(),
  reference: z.string(),
  title: z.string(),
  proposalState: z.string(),
  assessmentId: z.number(),
  carriedFrom: z.number().nullable(),
  votes: z
    .array(
      z.object({
        userId: z.string(),
        name: z.string(),
        choice: z.enum(VOTE_CHOICES),
        comment: z.string().nullable(),
        at: z.string(),
      }),
    )
    .describe('Board-internal: who voted how'),
  conflicts: z.array(z.object({ userId: z.string(), name: z.string(), reason: z.string(), at: z.string() })),
  tally: z.object({
    approve: z.number(),
    approveWithConditions: z.number(),
    refuse: z.number(),
    defer: z.number(),
    abstain: z.number(),
    declaredConflicts: z.number(),
    eligible: z.number(),
  }),
  quorumReached: z.boolean(),
  decision: z
    .object({
      id: z.number(),
      outcome: z.enum(DECISION_OUTCOMES),
      reasons: z.string(),
      conditions: z.array(conditionSchema),
      appealDays: z.number().nullable(),
      effectiveDate: z.string().nullable(),
      registerSeq: z.number().nullable(),
      decidedBy: z.string().nullable(),
      decidedAt: z.string(),
    })
    .nullable(),
});
export const meetingSchema = z.object({
  id: z.number(),
  date: z.string(),
  place: z.string(),
  version: z.number().describe('Row version: send it to reorder the agenda'),
  quorum: z.number(),
  items: z.array(itemSchema),
});

export const createMeeting = defineSpec({
  method: 'POST',
  path: '/api/meetings',
  tag: 'Board',
  summary:
    'Build a meeting: date, place and the assessed proposals on its agenda in order (they become on-agenda); ' +
    'deferred items waiting for a meeting are carried in first',
  access: ['chair', 'admin'],
  body: z.object({
    date: z.iso.date('Give the meeting date as YYYY-MM-DD.'),
    place: z.string().trim().min(2, 'Say where the board meets.').max(200),
    proposalIds: z.array(z.number().int().positive()).max(200).default([]),
  }),
  response: meetingSchema,
  status: 201,
});

export const listMeetings = defineSpec({
  method: 'GET',
  path: '/api/meetings',
  tag: 'Board',
  summary: 'Board meetings, newest first',
  access: ['board', 'chair', 'admin'],
  response: z.object({
    items: z.array(
      z.object({ id: z.number(), date: z.string(), place: z.string(), items: z.number(), openItems: z.number() }),
    ),
  }),
});

export const getMeeting = defineSpec({
  method: 'GET',
  path: '/api/meetings/{id}',
  tag: 'Board',
  summary: 'One meeting: its items with votes, declared conflicts, the tally against the quorum and the decision',
  access: ['board', 'chair', 'admin'],
  params: meetingParams,
  response: meetingSchema,
});

export const addMeetingItem = defineSpec({
  method: 'POST',
  path: '/api/meetings/{id}/items',
  tag: 'Board',
  summary: 'Put an assessed proposal on the agenda (it becomes on-agenda)',
  access: ['chair', 'admin'],
  params: meetingParams,
  body: z.object({ proposalId: z.number().int().positive() }),
  response: meetingSchema,
  status: 201,
});

export const declareConflict = defineSpec({
  method: 'POST',
  path: '/api/meetings/{id}/items/{itemId}/conflicts',
  tag: 'Board',
  summary: 'Declare a conflict of interest on an item: you cannot vote on it (a vote already cast is withdrawn)',
  access: ['board', 'chair'],
  params: itemParams,
  body: z.object({ reason: z.string().trim().min(3, 'Say what the interest is (at least 3 characters).').max(2000) }),
  response: z.object({ itemId: z.number(), declared: z.literal(true) }),
  status: 201,
});

export const castVote = defineSpec({
  method: 'PUT',
  path: '/api/meetings/{id}/items/{itemId}/vote',
  tag: 'Board',
  summary:
    'Vote on an item (approve, approve with conditions, refuse, defer, abstain) with an optional comment; voting again replaces your vote',
  access: ['board', 'chair'],
  params: itemParams,
  body: z.object({
    choice: z.enum(VOTE_CHOICES, { message: 'Vote approve, approve-with-conditions, refuse, defer or abstain.' }),
    comment: z.string().trim().max(2000).optional(),
  }),
  response: z.object({ itemId: z.number(), choice: z.enum(VOTE_CHOICES) }),
});

export const recordDecision = defineSpec({
  method: 'POST',
  path: '/api/meetings/{id}/items/{itemId}/decision',
  tag: 'Board',
  summary:
    'Record the decision on an item (once): approvals and refusals go to the register and the proposal becomes ' +
    'decided; a deferral carries it to the next meeting',
  access: ['chair', 'admin'],
  params: itemParams,
  body: z.object({
    outcome: z.enum(DECISION_OUTCOMES),
    reasons: z.string().trim().min(10, 'Give the reasons for the decision (at least 10 characters).').max(10_000),
    conditions: z.array(conditionSchema).max(50).default([]),
    appealDays: z
      .number()
      .int()
      .min(0)
      .max(365)
      .optional()
      .describe('Default: the authority setting board.appeal-days'),
    effectiveDate: z.iso
      .date()
      .optional()
      .describe('Default: the day after the appeal window (the decision day for a refusal)'),
  }),
  response: z.object({
    decisionId: z.number(),
    outcome: z.enum(DECISION_OUTCOMES),
    registerSeq: z.number().nullable(),
    registerHash: z.string().nullable(),
    proposalState: z.string(),
    carriedToMeeting: z.number().nullable(),
  }),
  status: 201,
});
