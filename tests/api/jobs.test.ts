/**
 * The job queue (pg-boss in PostgreSQL) through the running test server: an admin queues a run,
 * a worker of the app picks it up and runs the service, and the run's state and output are read
 * back; the schedules are stored in PostgreSQL, not in process memory.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { addDays } from '~/lib/proposals/states';
import { JOB_INFO, JOB_NAMES } from '~/lib/jobs/names';
import { decidedProposal, today } from '../support/board';
import { editRegisterByHand, lastMailId, testDb, waitForMail } from '../support/db';
import { api, DEMO, signIn, type Session } from '../support/http';

let planner: Session, assessor: Session, board: Session, chair: Session, admin: Session;
beforeAll(async () => {
  [planner, assessor, board, chair, admin] = await Promise.all(
    [DEMO.planner, DEMO.assessor, DEMO.board, DEMO.chair, DEMO.admin].map((e) => signIn(e)),
  );
});
afterAll(async () => {
  await testDb.destroy();
});

async function finished(name: string, jobId: string, timeoutMs = 30_000) {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const res = await api('GET', `/api/jobs/${name}/runs/${jobId}`, { session: admin });
    expect(res.status).toBe(200);
    if (['completed', 'failed'].includes(res.body.state)) return res.body;
    if (Date.now() > deadline) throw new Error(`run ${jobId} of ${name} is still ${res.body.state}`);
    await new Promise((r) => setTimeout(r, 300));
  }
}

describe('the job queue', () => {
  it('keeps its schedules in PostgreSQL, one per job, with the documented cron times', async () => {
    await api('GET', '/api/health'); // the first request starts the queue on this instance
    const deadline = Date.now() + 20_000;
    let rows: { name: string; cron: string }[] = [];
    while (Date.now() < deadline && rows.length < JOB_NAMES.length) {
      rows = await testDb.withSchema('pgboss').table('schedule').select('name', 'cron').orderBy('name');
      await new Promise((r) => setTimeout(r, 200));
    }
    expect(rows).toEqual(
      JOB_NAMES.map((n) => ({ name: n, cron: JOB_INFO[n].cron })).sort((a, b) => a.name.localeCompare(b.name)),
    );
  });

  it('only an admin may queue a run; unknown jobs are refused', async () => {
    expect((await api('POST', '/api/jobs/follow-up-overdue/run')).status).toBe(401);
    for (const s of [planner, assessor, board, chair])
      expect((await api('POST', '/api/jobs/follow-up-overdue/run', { session: s })).status).toBe(403);
    expect((await api('POST', '/api/jobs/no-such-job/run', { session: admin })).status).toBe(422);
  });

  it('a queued run really happens through pg-boss: the overdue task is mailed and the run completes with what it did', async () => {
    const d = await decidedProposal({ planner, assessor, board, chair }, 'approved-with-conditions');
    const task = await testDb('follow_up_task').where({ proposal_id: d.proposal.id, kind: 'condition' }).first();
    await testDb('follow_up_task')
      .where({ id: task.id })
      .update({ due_date: addDays(today(), -10) });
    const since = await lastMailId();
    const queued = await api('POST', '/api/jobs/follow-up-overdue/run', { session: admin });
    expect(queued.status).toBe(202);
    expect(queued.body.name).toBe('follow-up-overdue');
    const run = await finished('follow-up-overdue', queued.body.jobId);
    expect(run.state).toBe('completed');
    expect(run.output.overdue).toBeGreaterThanOrEqual(1);
    await waitForMail(DEMO.assessor, new RegExp(`Follow-up overdue on ${d.proposal.reference}`), since);
    expect(await testDb('notice_sent').where({ subject_type: 'follow_up_task', subject_id: task.id })).toHaveLength(1);
    // A second run finds nothing new to send.
    const second = await finished(
      'follow-up-overdue',
      (await api('POST', '/api/jobs/follow-up-overdue/run', { session: admin })).body.jobId,
    );
    expect(second.output.overdue).toBe(0);
    expect(
      Number((await testDb('audit_event').where({ action: 'job.run-now' }).count('* as n').first())?.n),
    ).toBeGreaterThanOrEqual(2);
  }, 120_000);

  it('the deadline reminder job runs the same way', async () => {
    const queued = await api('POST', '/api/jobs/deadline-reminders/run', { session: admin });
    expect(queued.status).toBe(202);
    const run = await finished('deadline-reminders', queued.body.jobId);
    expect(run).toMatchObject({
      state: 'completed',
      output: { reminders: expect.any(Number), overdue: expect.any(Number) },
    });
    expect(
      (await api('GET', `/api/jobs/deadline-reminders/runs/${crypto.randomUUID()}`, { session: admin })).status,
    ).toBe(404);
  });

  it('the register check recomputes the chain on a schedule; a break is logged and audited with the first broken entry', async () => {
    const ok = await finished(
      'register-check',
      (await api('POST', '/api/jobs/register-check/run', { session: admin })).body.jobId,
    );
    const entries = Number((await testDb('register_entry').count('* as n').first())?.n);
    expect(entries).toBeGreaterThan(0); // the demo history
    expect(ok).toMatchObject({ state: 'completed', output: { ok: true, entries, firstBrokenEntry: null } });

    // An entry's content edited by hand, as the database owner past the trigger: the next check names it.
    const target = 3;
    const original = (await testDb.raw('select content::text as c from register_entry where seq = ?', [target])).rows[0]
      .c;
    await editRegisterByHand(
      `update register_entry set content = jsonb_set(content, '{outcome}', '"tampered"') where seq = ?`,
      [target],
    );
    try {
      const broken = await finished(
        'register-check',
        (await api('POST', '/api/jobs/register-check/run', { session: admin })).body.jobId,
      );
      expect(broken).toMatchObject({ state: 'completed', output: { ok: false, firstBrokenEntry: target } });
      const audit = await testDb('audit_event').where({ action: 'job.register-check' }).orderBy('id', 'desc').first();
      expect(audit.details).toMatchObject({ ok: false, firstBrokenEntry: target });
    } finally {
      await editRegisterByHand('update register_entry set content = ?::jsonb where seq = ?', [original, target]);
    }
    expect((await api('GET', '/api/register/verify')).body).toMatchObject({ ok: true, firstBrokenEntry: null });
  });
});
