/** The timed jobs (pure: names, schedules and words; the handlers live in queue.ts). Cron times are UTC. */
export const JOB_NAMES = ['deadline-reminders', 'follow-up-overdue', 'register-check'] as const;
export type JobName = (typeof JOB_NAMES)[number];

export const JOB_INFO: Record<JobName, { cron: string; summary: string }> = {
  'deadline-reminders': {
    cron: '15 6 * * *',
    summary:
      'Mails the assessors and the chair once per proposal when its decision deadline is near (setting proposal.reminder-days) and once when it has passed.',
  },
  'follow-up-overdue': {
    cron: '30 6 * * *',
    summary: 'Mails the assignee role once per open follow-up task whose due date has passed.',
  },
  'register-check': {
    cron: '*/30 * * * *',
    summary:
      'Recomputes the public register’s hash chain and records the blocks that hold, so a check by the public only hashes ' +
      'what is new; a break is logged as an error and in the audit log with the first broken entry.',
  },
};
