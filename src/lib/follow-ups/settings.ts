/** Settings of follow-up tasks and compensation sites (pure schema with defaults; stored in app_setting). */
import { z } from 'zod';

export const followUpSettingsSchema = z.object({
  /** Days after an approval takes effect by which someone confirms on site that the conversion follows the decision. */
  'follow-up.site-check-days': z.number().int().min(0).max(3650).default(90),
  /** Days the chair has to put a reversed compensation before the board. */
  'follow-up.reversal-review-days': z.number().int().min(0).max(365).default(28),
  /**
   * Years a compensation parcel must stay in grass after the approval takes effect. 5 years: the period
   * re-converted land had to stay permanent grassland under the earlier EU direct-payment rules
   * (Reg. (EU) No 1307/2013 Art. 45 with Delegated Reg. (EU) No 639/2014 Art. 44); set it from local law.
   */
  'compensation.permanence-years': z.number().int().min(1).max(100).default(5),
});

export type FollowUpSettings = z.output<typeof followUpSettingsSchema>;
export const FOLLOW_UP_SETTING_KEYS = Object.keys(followUpSettingsSchema.shape) as (keyof FollowUpSettings)[];

export function readFollowUpSettings(rows: { key: string; value: unknown }[]): FollowUpSettings {
  const stored = Object.fromEntries(
    rows.filter((r) => (FOLLOW_UP_SETTING_KEYS as string[]).includes(r.key)).map((r) => [r.key, r.value]),
  );
  const parsed = followUpSettingsSchema.safeParse(stored);
  if (!parsed.success)
    throw new Error(
      `setting "${String(parsed.error.issues[0]!.path[0])}" is invalid: ${parsed.error.issues[0]!.message}`,
    );
  return parsed.data;
}

export const TASK_KINDS = ['condition', 'site-check', 'compensation-check', 'compensation-reversed'] as const;
export type TaskKind = (typeof TASK_KINDS)[number];
export const TASK_KIND_LABELS: Record<TaskKind, string> = {
  condition: 'Condition of the decision',
  'site-check': 'Site check of the conversion',
  'compensation-check': 'Compensation parcel restored',
  'compensation-reversed': 'Compensation parcel ploughed',
};
export const TASK_STATUSES = ['open', 'done', 'not-done', 'partly'] as const;
export type TaskStatus = (typeof TASK_STATUSES)[number];
export const OUTCOMES = ['done', 'not-done', 'partly'] as const;
export type TaskOutcome = (typeof OUTCOMES)[number];
export const STATUS_LABELS: Record<TaskStatus, string> = {
  open: 'Open',
  done: 'Done',
  'not-done': 'Not done',
  partly: 'Partly done',
};

/** Adds whole years to a date "YYYY-MM-DD" (29 February becomes 28 February in a common year). */
export function addYears(date: string, years: number): string {
  const [y, m, d] = date.split('-').map(Number) as [number, number, number];
  const target = new Date(Date.UTC(y + years, m - 1, d));
  if (target.getUTCMonth() !== m - 1) target.setUTCDate(0);
  return target.toISOString().slice(0, 10);
}

/** Tillage that breaks the sward and land uses that are no longer grass: what ends a compensation parcel's permanence. */
export const SWARD_BREAKING_TILLAGE = ['ploughing', 'rotavating', 'discing'];
