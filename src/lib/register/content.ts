/**
 * What a register entry holds (pure). Public by design: the proposal's reference and title, the
 * parcels' references, areas and geometry, the outcome with reasons and conditions, the figures
 * with their range, the factor-set and rule-set versions, the meeting and the time. Never the
 * applicant, owners, holding references, who voted how or vote comments.
 */
import { z } from 'zod';

export const OUTCOMES = ['approved', 'approved-with-conditions', 'refused'] as const;
export type Outcome = (typeof OUTCOMES)[number];
export const OUTCOME_LABELS: Record<Outcome, string> = {
  approved: 'Approved',
  'approved-with-conditions': 'Approved with conditions',
  refused: 'Refused',
};
export const ENTRY_KINDS = ['decision', 'correction', 'appeal-outcome', 'compensation-reversed'] as const;
export const ENTRY_KIND_LABELS: Record<(typeof ENTRY_KINDS)[number], string> = {
  decision: 'Board decision',
  correction: 'Correction',
  'appeal-outcome': 'Outcome of an appeal',
  'compensation-reversed': 'Compensation reversed',
};

export const conditionSchema = z.object({
  text: z.string().trim().min(5, 'Describe the condition (at least 5 characters).').max(2000),
  dueDate: z.iso.date('Give the due date as YYYY-MM-DD.'),
  checkedBy: z.string().trim().min(2, 'Say who checks the condition (an office, e.g. "Field officer").').max(200),
  restoreParcel: z
    .string()
    .trim()
    .min(1)
    .max(60)
    .optional()
    .describe(
      'Reference of a parcel the condition requires restored to grassland; it is then held in grass for the permanence period',
    ),
});
export type Condition = z.output<typeof conditionSchema>;

const multiPolygon = z.object({
  type: z.literal('MultiPolygon'),
  coordinates: z.array(z.array(z.array(z.array(z.number())))),
});

export const registerContentSchema = z.object({
  kind: z.enum(ENTRY_KINDS),
  proposal: z.object({ reference: z.string(), title: z.string(), proposedUse: z.string(), startYear: z.number() }),
  parcels: z.array(z.object({ reference: z.string(), areaHa: z.number(), part: z.boolean(), geometry: multiPolygon })),
  areaHa: z.number(),
  region: z.string().nullable().describe('The accounting region holding most of the area'),
  outcome: z.enum(OUTCOMES),
  reasons: z.string(),
  conditions: z.array(conditionSchema),
  figures: z.object({
    co2eTotal: z.number(),
    co2eLow: z.number(),
    co2eHigh: z.number(),
    socChangeTotal: z.number(),
    runs: z.number(),
    gwp: z.string(),
    unit: z.literal('t CO2e'),
  }),
  risk: z.object({ level: z.number(), label: z.string() }),
  factorSet: z.object({ id: z.string(), version: z.number() }),
  ruleSet: z.object({ id: z.string(), version: z.number() }).nullable(),
  assessment: z.object({ number: z.number() }),
  meeting: z.object({ date: z.string(), place: z.string() }).nullable(),
  votes: z
    .object({
      approve: z.number(),
      approveWithConditions: z.number(),
      refuse: z.number(),
      defer: z.number(),
      abstain: z.number(),
      declaredConflicts: z.number(),
    })
    .nullable(),
  appealUntil: z.string().nullable(),
  effectiveDate: z.string(),
  decidedOn: z.string().describe('YYYY-MM-DD'),
  recordedAt: z.string().describe('ISO time the entry was written'),
  supersedes: z.number().nullable(),
  note: z.string().nullable().describe('Why a correction or appeal outcome replaces the earlier entry'),
  compensation: z
    .object({
      parcelReference: z.string(),
      areaHa: z.number(),
      creditedCo2e: z.number().describe('t CO2e removal credited against the approval (positive)'),
      permanenceUntil: z.string(),
    })
    .optional()
    .describe('An approval only: the parcel restored to grassland as compensation and the gain credited for it'),
  reverses: z
    .object({
      seq: z.number().describe('The entry whose compensation is reversed'),
      parcelReference: z.string(),
      creditedCo2e: z.number(),
      eventDate: z.string(),
      permanenceUntil: z.string(),
      budgetYear: z.number().describe('The budget year the reversed gain counts in: the year the parcel was ploughed'),
    })
    .optional()
    .describe('A compensation-reversed entry only: the credited gain it takes back'),
});
export type RegisterContent = z.output<typeof registerContentSchema>;

/** Rounds a number for the register (figures to 3 decimals: grams of CO2e are noise). */
export const round = (x: number, dp = 3) => Math.round(x * 10 ** dp) / 10 ** dp;
