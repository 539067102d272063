/**
 * The timed notices, as plain service functions (the job queue calls them; tests may too):
 * - proposals whose statutory decision deadline is within `proposal.reminder-days` get one reminder
 *   per deadline, overdue proposals one overdue notice per deadline, to the assessors and the chair;
 * - open follow-up tasks past their due date get one overdue notice, to their assignee role.
 * Each notice is claimed in `notice_sent` before its mail is queued in the outbox, in one
 * transaction: however often and wherever the job runs, a notice goes out once.
 */
import { recordAudit } from '../db/audit';
import { db, withTransaction, type Db } from '../db/client';
import { claimNotice, countRecipients, overdueOpenTasks } from '../db/follow-ups';
import { getProposalSettings, usersWithRole } from '../db/proposals';
import { enqueueMail } from '../mail/outbox';
import { decisionDueMail, decisionOverdueMail, followUpOverdueMail, type MailContent } from '../mail/templates';
import { addDays, daysLeft } from '../proposals/states';
import { followUpsUrl } from './follow-ups';
import { proposalUrl } from './proposals';

/** States in which the statutory clock runs (a returned proposal starts again when resubmitted). */
export const CLOCK_STATES = ['submitted', 'in-assessment', 'assessed', 'on-agenda'];
const today = () => new Date().toISOString().slice(0, 10);

async function mailTo(trx: Db, roles: string[], make: (u: { name: string }) => MailContent): Promise<number> {
  const seen = new Set<string>();
  for (const role of roles) {
    for (const u of await usersWithRole(trx, role)) {
      if (seen.has(u.email)) continue;
      seen.add(u.email);
      await enqueueMail(trx, { to: u.email, ...make(u) });
    }
  }
  return seen.size;
}

export async function sendDeadlineReminders(on = today()): Promise<{ reminders: number; overdue: number }> {
  return withTransaction(db, async (trx) => {
    const days = (await getProposalSettings(trx))['proposal.reminder-days'];
    const due = await trx('proposal')
      .select('id', 'reference', 'title', 'state', trx.raw("to_char(decision_due, 'YYYY-MM-DD') as decision_due"))
      .whereIn('state', CLOCK_STATES)
      .whereNotNull('decision_due')
      .where('decision_due', '<=', addDays(on, days))
      .orderBy('decision_due')
      .orderBy('id');
    const sent = { reminders: 0, overdue: 0 };
    for (const p of due as { id: number; reference: string; title: string; state: string; decision_due: string }[]) {
      const left = daysLeft(p.decision_due, on);
      const notice = `${left < 0 ? 'deadline-overdue' : 'deadline-reminder'}:${p.decision_due}`;
      if (!(await claimNotice(trx, 'proposal', p.id, notice))) continue;
      const ref = {
        reference: p.reference,
        title: p.title,
        url: proposalUrl(p.id),
        decisionDue: p.decision_due,
        state: p.state,
      };
      const n = await mailTo(trx, ['assessor', 'chair'], (u) =>
        left < 0
          ? decisionOverdueMail({ ...ref, name: u.name, daysOver: -left })
          : decisionDueMail({ ...ref, name: u.name, daysLeft: left }),
      );
      await countRecipients(trx, 'proposal', p.id, notice, n);
      sent[left < 0 ? 'overdue' : 'reminders']++;
    }
    if (sent.reminders + sent.overdue)
      await recordAudit(trx, {
        actorId: null,
        action: 'job.deadline-reminders',
        entityType: 'job',
        entityId: 'deadline-reminders',
        details: { on, ...sent },
      });
    return sent;
  });
}

export async function sendFollowUpOverdueNotices(on = today()): Promise<{ overdue: number }> {
  return withTransaction(db, async (trx) => {
    let overdue = 0;
    for (const t of await overdueOpenTasks(trx, on)) {
      if (!(await claimNotice(trx, 'follow_up_task', t.id, 'follow-up-overdue'))) continue;
      const n = await mailTo(trx, [t.assignee_role], (u) =>
        followUpOverdueMail({
          reference: t.reference,
          title: t.proposal_title,
          url: followUpsUrl(),
          name: u.name,
          task: t.title,
          dueDate: t.due_date,
          checkedBy: t.checked_by,
        }),
      );
      await countRecipients(trx, 'follow_up_task', t.id, 'follow-up-overdue', n);
      overdue++;
    }
    if (overdue)
      await recordAudit(trx, {
        actorId: null,
        action: 'job.follow-up-overdue',
        entityType: 'job',
        entityId: 'follow-up-overdue',
        details: { on, overdue },
      });
    return { overdue };
  });
}
