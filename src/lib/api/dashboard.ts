/** Contract of the staff dashboard (figures over the register, the regions and open work). */
import { z } from 'zod';
import { defineSpec } from '../http/spec';

export const DASHBOARD_READERS = ['planner', 'assessor', 'board', 'chair', 'admin'] as const;

const nullableNumber = z.number().nullable();
const budgetFigures = {
  budgetT: nullableNumber,
  committedT: z.number(),
  leftT: nullableNumber,
  usedShare: nullableNumber,
};

export const getDashboard = defineSpec({
  method: 'GET',
  path: '/api/dashboard',
  tag: 'Register',
  summary:
    'Staff dashboard: grassland converted and restored per year, CO2e committed against the yearly budget, each ' +
    'region’s ratio and headroom, conditions and overdue proposals',
  access: [...DASHBOARD_READERS],
  response: z.object({
    asOf: z.string(),
    year: z.number().int(),
    changes: z
      .array(z.object({ year: z.number().int(), convertedHa: z.number(), restoredHa: z.number() }))
      .describe('Approved changes by year of decision (current register entries)'),
    budget: z.object({
      budgetT: nullableNumber.describe(
        'The authority’s yearly CO2e budget (setting budget.yearly-co2e-t); null when none is set',
      ),
      years: z
        .array(z.object({ year: z.number().int(), ...budgetFigures }))
        .describe('Committed CO2e by budget year (the proposals’ start year)'),
      thisYear: z.object({ year: z.number().int(), ...budgetFigures }),
    }),
    ratioRule: z
      .object({
        ruleSet: z.object({ id: z.string(), version: z.number() }),
        ruleId: z.string(),
        maxRelativeFall: z.number(),
        citation: z.string(),
      })
      .nullable(),
    regions: z.array(
      z.object({
        key: z.string(),
        label: z.string(),
        agriculturalHa: z.number(),
        permanentGrasslandHa: z.number(),
        pendingConvertedHa: z.number().describe('Conversions approved but not yet in the land-use record'),
        referenceRatio: nullableNumber,
        referenceYear: nullableNumber,
        referenceSource: z.string().nullable(),
        referenceOrigin: z.enum(['computed', 'entered']).nullable(),
        ratioNow: nullableNumber,
        ratioAfterPending: nullableNumber,
        limitRatio: nullableNumber,
        headroomHa: nullableNumber.describe(
          'Permanent grassland that could still be converted before the ratio passes the limit',
        ),
        shortfallHa: z.number(),
      }),
    ),
    conditions: z.object({
      open: z.number().int(),
      overdue: z.number().int(),
      items: z.array(
        z.object({
          seq: z.number(),
          reference: z.string(),
          text: z.string(),
          dueDate: z.string(),
          checkedBy: z.string(),
          overdue: z.boolean(),
          daysPast: z.number(),
        }),
      ),
    }),
    overdueProposals: z.array(
      z.object({
        id: z.number(),
        reference: z.string(),
        title: z.string(),
        state: z.string(),
        decisionDue: z.string(),
        daysOverdue: z.number(),
      }),
    ),
  }),
});
