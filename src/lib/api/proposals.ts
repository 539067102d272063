/** Contracts of the proposal routes: filing, listing, editing, moving through the states, attachments. */
import { z } from 'zod';
import { landUseStateSchema } from '../carbon';
import { defineSpec } from '../http/spec';
import { PROPOSAL_STATES } from '../proposals/states';

const idParams = z.object({
  id: z.coerce
    .number()
    .int()
    .positive('Proposal ids are positive whole numbers.')
    .max(2 ** 31 - 1),
});
const position = z.array(z.number()).min(2).max(3);
/** A part of a parcel drawn on the map: a GeoJSON Polygon in EPSG:4326 inside the parcel. */
const partSchema = z.object({
  type: z.literal('Polygon'),
  coordinates: z.array(z.array(position).min(4)).min(1).max(50),
});
const rowVersion = z
  .number()
  .int()
  .positive()
  .max(2 ** 31 - 1)
  .describe('The row version you read; a stale one gets 409');

export const applicantSchema = z.object({
  name: z.string().trim().min(2, 'Give the applicant’s name.').max(200),
  contact: z.string().trim().min(3, 'Give a postal address, e-mail or telephone number.').max(300),
  interest: z.enum(['owner', 'tenant', 'agent'], { message: 'Interest in the land is owner, tenant or agent.' }),
});

export const proposalFieldsSchema = z.object({
  title: z.string().trim().min(3, 'Give the proposal a title (at least 3 characters).').max(200),
  description: z.string().trim().min(10, 'Describe the proposed change (at least 10 characters).').max(10_000),
  startYear: z
    .number()
    .int()
    .min(2000, 'The start year is 2000 or later.')
    .max(2100, 'The start year is 2100 or earlier.'),
  parcels: z
    .array(
      z.object({
        parcelId: z
          .number()
          .int()
          .positive()
          .max(2 ** 53),
        part: partSchema.optional(),
      }),
    )
    .min(1, 'Name at least one parcel.')
    .max(5000, 'At most 5,000 parcels in one proposal.'),
  proposed: landUseStateSchema,
  applicant: applicantSchema,
});

export const createProposal = defineSpec({
  method: 'POST',
  path: '/api/proposals',
  tag: 'Proposals',
  summary:
    'File a proposal (draft): parcels or parts of parcels, the proposed use and management, start year, applicant (private), description',
  access: ['planner'],
  body: proposalFieldsSchema,
  response: z.object({ id: z.number(), reference: z.string(), state: z.literal('draft'), version: z.number() }),
  status: 201,
});

export const proposalSummarySchema = z.object({
  id: z.number(),
  reference: z.string(),
  title: z.string(),
  state: z.enum(PROPOSAL_STATES),
  parcelCount: z.number(),
  parcelReferences: z.array(z.string()),
  areaHa: z.number(),
  startYear: z.number(),
  submittedAt: z.string().nullable(),
  decisionDue: z.string().nullable(),
  daysLeft: z
    .number()
    .nullable()
    .describe(
      'Days to the decision deadline; negative when overdue; null before submission or once decided or withdrawn',
    ),
  riskLevel: z.number().nullable(),
  riskLabel: z.string().nullable(),
  co2eTotal: z.number().nullable(),
  updatedAt: z.string(),
});

export const listProposals = defineSpec({
  method: 'GET',
  path: '/api/proposals',
  tag: 'Proposals',
  summary: 'Proposals, paged on the server; filter by state, parcel reference, risk level; sort',
  access: 'signed-in',
  query: z.object({
    state: z.enum(PROPOSAL_STATES).optional(),
    parcel: z.string().trim().max(60).optional().describe('Parcel reference (exact, case-insensitive)'),
    risk: z.coerce.number().int().min(1).max(4).optional(),
    q: z.string().trim().max(100).optional().describe('Words in the reference or title'),
    sort: z.enum(['reference', 'title', 'state', 'updated', 'deadline', 'risk', 'co2e', 'area']).default('updated'),
    dir: z.enum(['asc', 'desc']).default('desc'),
    page: z.coerce.number().int().min(1).max(100_000).default(1),
    pageSize: z.coerce.number().int().min(1).max(200).default(25),
  }),
  response: z.object({
    items: z.array(proposalSummarySchema),
    total: z.number(),
    page: z.number(),
    pageSize: z.number(),
  }),
});

const stateEvent = z.object({
  from: z.string().nullable(),
  to: z.string(),
  reason: z.string().nullable(),
  by: z.string().nullable(),
  at: z.string(),
});
const attachment = z.object({
  id: z.string(),
  fileName: z.string(),
  mediaType: z.string(),
  sizeBytes: z.number(),
  sha256: z.string(),
  uploadedBy: z.string().nullable(),
  uploadedAt: z.string(),
});

export const proposalDetailSchema = proposalSummarySchema.extend({
  description: z.string(),
  proposed: landUseStateSchema,
  version: z.number(),
  applicant: applicantSchema.nullable().describe('planners, assessors and admins only'),
  parcels: z.array(
    z.object({
      parcelId: z.number(),
      reference: z.string(),
      name: z.string().nullable(),
      areaHa: z.number(),
      parcelAreaHa: z.number(),
      part: z.record(z.string(), z.unknown()).nullable(),
      geometry: z.record(z.string(), z.unknown()),
    }),
  ),
  history: z.array(stateEvent),
  attachments: z.array(attachment),
  assessments: z.array(
    z.object({
      id: z.number(),
      number: z.number(),
      status: z.enum(['draft', 'signed']),
      version: z.number(),
      riskLevel: z.number().nullable(),
      co2eTotal: z.number().nullable(),
      signedAt: z.string().nullable(),
      signedBy: z.string().nullable(),
    }),
  ),
  createdBy: z.string().nullable(),
  createdAt: z.string(),
});

export const getProposal = defineSpec({
  method: 'GET',
  path: '/api/proposals/{id}',
  tag: 'Proposals',
  summary:
    'One proposal: parcels with geometry, proposed change, state history, attachments, assessment versions (applicant for planners, assessors, admins)',
  access: 'signed-in',
  params: idParams,
  response: proposalDetailSchema,
});

export const updateProposal = defineSpec({
  method: 'PATCH',
  path: '/api/proposals/{id}',
  tag: 'Proposals',
  summary: 'Change a draft or returned proposal (send the version you read; 409 when someone else changed it)',
  access: ['planner'],
  params: idParams,
  body: proposalFieldsSchema.partial().extend({ version: rowVersion }),
  response: z.object({ id: z.number(), reference: z.string(), state: z.enum(PROPOSAL_STATES), version: z.number() }),
});

export const transitionProposal = defineSpec({
  method: 'POST',
  path: '/api/proposals/{id}/transitions',
  tag: 'Proposals',
  summary:
    'Move a proposal to another state (409 when the version is stale or the state machine does not allow it; 403 when your role may not)',
  access: ['planner', 'assessor'],
  params: idParams,
  body: z.object({ to: z.enum(PROPOSAL_STATES), version: rowVersion, reason: z.string().trim().max(2000).optional() }),
  response: z.object({ id: z.number(), state: z.enum(PROPOSAL_STATES), version: z.number() }),
});

export const addAttachment = defineSpec({
  method: 'POST',
  path: '/api/proposals/{id}/attachments',
  tag: 'Proposals',
  summary: 'Attach a document (multipart, field "file"; PDF, PNG or JPEG, checked by content; size limit as a setting)',
  access: ['planner', 'assessor'],
  params: idParams,
  multipart: true,
  response: attachment,
  status: 201,
});

export const getAttachment = defineSpec({
  method: 'GET',
  path: '/api/proposals/{id}/attachments/{attachmentId}',
  tag: 'Proposals',
  summary: 'Download an attached document',
  access: ['planner', 'assessor', 'board', 'chair', 'admin'],
  params: idParams.extend({ attachmentId: z.uuid('Attachment ids are UUIDs.') }),
  response: null,
  responseType: 'application/octet-stream',
});
