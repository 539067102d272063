/** Contracts of the board pack (JSON and PDF), the agenda order and the public decision notice (PDF). */
import { z } from 'zod';
import { defineSpec } from '../http/spec';

const id = z.coerce
  .number()
  .int()
  .positive()
  .max(2 ** 31 - 1);
const range = { co2eLow: z.number().nullable(), co2eHigh: z.number().nullable() };

export const packSchema = z.object({
  meeting: z.object({ id: z.number(), date: z.string(), place: z.string() }),
  item: z.object({ id: z.number(), position: z.number(), status: z.string() }),
  proposal: z.object({
    id: z.number(),
    reference: z.string(),
    title: z.string(),
    state: z.string(),
    proposed: z.record(z.string(), z.unknown()),
    startYear: z.number(),
  }),
  clock: z.object({
    decisionDue: z.string().nullable(),
    daysLeft: z.number().nullable(),
    state: z
      .enum(['overdue', 'near', 'running', 'stopped'])
      .describe('near: within the reminder days of proposal.reminder-days'),
  }),
  parcels: z
    .array(
      z.object({
        reference: z.string(),
        areaHa: z.number(),
        parcelAreaHa: z.number(),
        part: z.boolean(),
        geometry: z.object({ type: z.literal('MultiPolygon'), coordinates: z.array(z.unknown()) }),
        currentState: z.record(z.string(), z.unknown()).nullable(),
        stateSource: z.object({ source: z.enum(['record', 'assessor']), note: z.string() }).nullable(),
        climate: z.string().nullable(),
        soils: z.array(z.object({ type: z.string(), fraction: z.number() })),
        overlayFlags: z.array(z.string()),
        regionKey: z.string().nullable(),
        permanentGrassland: z.boolean().nullable(),
        neverTilled: z.boolean().nullable(),
        sensitiveShare: z.number(),
        co2eTotal: z.number().nullable(),
      }),
    )
    .describe('No owner or holding reference'),
  assessment: z.object({
    id: z.number(),
    number: z.number(),
    signedBy: z.string().nullable(),
    signedAt: z.string().nullable(),
    findings: z.string(),
    factorSet: z.object({ id: z.string(), version: z.number() }),
    gwp: z.string(),
    totals: z.object({
      areaHa: z.number(),
      socChangeTotal: z.number(),
      biomassChangeTotal: z.number(),
      n2oTotal: z.number(),
      co2eTotal: z.number(),
      co2eLow: z.number(),
      co2eHigh: z.number(),
      runs: z.number(),
      seed: z.number(),
    }),
  }),
  risk: z.object({
    level: z.number().int().min(1).max(4),
    label: z.string(),
    reasons: z.array(z.object({ text: z.string(), citation: z.string(), level: z.number(), gate: z.boolean() })),
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
      ...range,
      differenceFromProposal: z.number().nullable(),
    }),
  ),
  impact: z.object({
    regions: z
      .array(
        z.object({
          key: z.string(),
          label: z.string(),
          agriculturalHa: z.number(),
          permanentGrasslandHa: z.number(),
          ratioNow: z.number().nullable(),
          ratioAfter: z.number().nullable(),
          referenceRatio: z.number().nullable(),
          referenceYear: z.number().nullable(),
          referenceSource: z.string().nullable(),
          relativeFallAfter: z.number().nullable(),
          convertedHa: z.number(),
        }),
      )
      .describe('Permanent-grassland ratio of each region the proposal touches, today and if approved'),
    budget: z
      .object({
        year: z.number(),
        budgetT: z.number().nullable(),
        committedT: z.number(),
        proposalT: z.number(),
        afterT: z.number(),
        shareAfter: z.number().nullable(),
        overBudget: z.boolean().nullable(),
      })
      .describe('CO2e committed by current approvals for the start year, and after approving this proposal'),
  }),
  cautions: z.array(z.string()),
});

export const getItemPack = defineSpec({
  method: 'GET',
  path: '/api/meetings/{id}/items/{itemId}/pack',
  tag: 'Board',
  summary:
    'The board pack of an agenda item: parcels and their facts, figures with their range, risk with reasons, ' +
    'alternatives, findings, the statutory clock and the impact of approving (no applicant or owner data)',
  access: ['board', 'chair', 'admin'],
  params: z.object({ id, itemId: id }),
  response: packSchema,
});

export const getMeetingPackPdf = defineSpec({
  method: 'GET',
  path: '/api/meetings/{id}/pack.pdf',
  tag: 'Board',
  summary:
    'The whole meeting’s board pack as a PDF: one section per item with the parcel map, figures, risk reasons and impact preview',
  access: ['board', 'chair', 'admin'],
  params: z.object({ id }),
  response: null,
  responseType: 'application/pdf',
});

export const reorderItems = defineSpec({
  method: 'PUT',
  path: '/api/meetings/{id}/order',
  tag: 'Board',
  summary:
    'Set the agenda order: every item id of the meeting once, in the new order, with the meeting version you read (a stale version gets 409)',
  access: ['chair', 'admin'],
  params: z.object({ id }),
  body: z.object({
    itemIds: z.array(z.number().int().positive()).min(1, 'List the items in their new order.').max(500),
    version: z.number().int().positive().describe('The meeting version you read'),
  }),
  response: z.object({ id: z.number(), version: z.number(), itemIds: z.array(z.number()) }),
});

export const registerNoticePdf = defineSpec({
  method: 'GET',
  path: '/api/register/{seq}/notice.pdf',
  tag: 'Register',
  summary:
    'The decision notice of a register entry as a PDF: only the public register content, with the entry hash and the head hash',
  access: 'public',
  params: z.object({
    seq: z.coerce
      .number()
      .int()
      .positive('Register entries are numbered 1, 2, 3 ...')
      .max(2 ** 53),
  }),
  response: null,
  responseType: 'application/pdf',
});
