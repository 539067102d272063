/**
 * The authority's proposal and assessment settings (pure schema with defaults; stored in app_setting).
 */
import { z } from 'zod';

export const proposalSettingsSchema = z.object({
  /**
   * Days from a valid submission to the decision deadline. 35 days: the screening-decision period of the England EIA
   * (Agriculture) (No.2) Regulations 2006, reg. 8(5).
   */
  'proposal.decision-days': z.number().int().positive().default(35),
  /** Largest attachment, bytes. */
  'proposal.attachment-max-bytes': z
    .number()
    .int()
    .positive()
    .default(15 * 1024 * 1024),
  /** Days before the deadline when the decision-due reminder goes out. */
  'proposal.reminder-days': z.number().int().nonnegative().default(7),
  /** Allow signing off while a factor table used is not yet confirmed by this authority. */
  'assessment.allow-unconfirmed-sign-off': z.boolean().default(false),
  /** Monte Carlo runs for the joint range of an assessment. */
  'assessment.runs': z.number().int().min(100).max(20_000).default(1000),
  /** GWP set assessments use unless the assessor overrides it with a reason. */
  'assessment.gwp': z.enum(['ar4', 'ar5', 'ar6']).default('ar5'),
  /** The authority's yearly CO2e budget for committed conversions, t CO2e; null = none set. */
  'budget.yearly-co2e-t': z.number().positive().nullable().default(5000),
});

export type ProposalSettings = z.output<typeof proposalSettingsSchema>;
export const PROPOSAL_SETTING_KEYS = Object.keys(proposalSettingsSchema.shape) as (keyof ProposalSettings)[];

export function readProposalSettings(rows: { key: string; value: unknown }[]): ProposalSettings {
  const stored = Object.fromEntries(
    rows.filter((r) => (PROPOSAL_SETTING_KEYS as string[]).includes(r.key)).map((r) => [r.key, r.value]),
  );
  const parsed = proposalSettingsSchema.safeParse(stored);
  if (!parsed.success) {
    const i = parsed.error.issues[0]!;
    throw new Error(`setting "${String(i.path[0])}" is invalid: ${i.message}`);
  }
  return parsed.data;
}
