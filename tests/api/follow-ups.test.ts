/**
 * Follow-up tasks through the API: created by decisions (one per condition, one site check per
 * approval), outcomes with optimistic locking and roles, evidence files checked by content, the
 * overdue list, and the timed notices (deadline reminders, overdue tasks) mailed once through the
 * outbox and the fake SMTP server.
 */
import { createHash } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { addDays } from '~/lib/proposals/states';
import { sendDeadlineReminders, sendFollowUpOverdueNotices } from '~/lib/services/reminders';
import { db } from '~/lib/db/client';
import { assessedProposal, CONDITION, createMeeting, decide, decidedProposal, today, vote } from '../support/board';
import { lastMailId, testDb, waitForMail } from '../support/db';
import { BASE_URL } from '../support/env';
import { api, DEMO, signIn, type Session } from '../support/http';
import { allowSignOff, drawParcel, fileProposal, submit } from '../support/proposals';

let planner: Session, assessor: Session, board: Session, chair: Session, admin: Session;
beforeAll(async () => {
  [planner, assessor, board, chair, admin] = await Promise.all(
    [DEMO.planner, DEMO.assessor, DEMO.board, DEMO.chair, DEMO.admin].map((e) => signIn(e)),
  );
  await allowSignOff();
});
afterAll(async () => {
  await testDb('app_setting').where({ key: 'follow-up.site-check-days' }).delete();
  await testDb.destroy();
  await db.destroy();
});

const s = () => ({ planner, assessor, board, chair });
const usersWith = async (role: string) =>
  (
    await testDb.raw(
      `select email from "user" where ? = any(string_to_array(role, ',')) and coalesce(banned, false) = false order by email`,
      [role],
    )
  ).rows.map((r: { email: string }) => r.email);
const tasksOf = async (reference: string, session: Session = assessor) =>
  (await api('GET', `/api/follow-ups?reference=${reference}&pageSize=200`, { session })).body.items as any[];

// PNG (ISO/IEC 15948): signature, then an IHDR chunk of 1 x 1 pixels.
const png = Uint8Array.from([
  0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 13, 0x49, 0x48, 0x44, 0x52, 0, 0, 0, 1, 0, 0, 0, 1, 8, 2, 0,
  0, 0, 0x90, 0x77, 0x53, 0xde, 0, 0, 0, 0,
]);
async function upload(taskId: number, name: string, bytes: Uint8Array, session: Session) {
  const form = new FormData();
  form.set('file', new Blob([bytes as BlobPart]), name);
  const res = await fetch(`${BASE_URL}/api/follow-ups/${taskId}/evidence`, {
    method: 'POST',
    headers: { cookie: session.cookie, origin: BASE_URL },
    body: form,
  });
  return { status: res.status, body: await res.json() };
}

describe('tasks created by decisions', () => {
  it('an approval with two conditions makes one task per condition and one site check, in the decision transaction', async () => {
    await testDb('app_setting')
      .insert({ key: 'follow-up.site-check-days', value: JSON.stringify(60) })
      .onConflict('key')
      .merge();
    const second = {
      text: 'Sow a grass margin of 4 m along the hedge.',
      dueDate: '2027-05-31',
      checkedBy: 'Hedgerow officer',
    };
    const d = await decidedProposal(s(), 'approved');
    const p = await assessedProposal(planner, assessor);
    const m = await createMeeting(chair, [p.id]);
    const item = m.items.find((i) => i.proposalId === p.id)!;
    for (const who of [board, chair])
      expect((await vote(who, m.id, item.id, 'approve-with-conditions')).status).toBe(200);
    const res = await decide(chair, m.id, item.id, {
      outcome: 'approved-with-conditions',
      conditions: [CONDITION, second],
      effectiveDate: '2027-01-15',
    });
    expect(res.status).toBe(201);
    const tasks = await tasksOf(p.reference);
    expect(tasks.map((t) => t.kind).sort()).toEqual(['condition', 'condition', 'site-check']);
    const cond = tasks.filter((t) => t.kind === 'condition').sort((a, b) => a.dueDate.localeCompare(b.dueDate));
    expect(cond.map((t) => [t.title, t.dueDate, t.checkedBy])).toEqual([
      [second.text, second.dueDate, second.checkedBy],
      [CONDITION.text, CONDITION.dueDate, CONDITION.checkedBy],
    ]);
    const site = tasks.find((t) => t.kind === 'site-check');
    // 2027-01-15 + 60 days = 2027-03-16 (31 - 15 = 16 days of January, 28 of February, 16 of March: calendar arithmetic).
    expect(site).toMatchObject({
      dueDate: '2027-03-16',
      status: 'open',
      registerSeq: res.body.registerSeq,
      assigneeRole: 'assessor',
    });
    expect(site.title).toContain((await testDb('parcel').where({ id: p.parcelId }).first()).reference);
    // The plain approval has its site check too; a refusal leaves no task.
    expect((await tasksOf(d.proposal.reference)).map((t) => t.kind)).toEqual(['site-check']);
    const refused = await decidedProposal(s(), 'refused');
    expect(await tasksOf(refused.proposal.reference)).toEqual([]);
  }, 120_000);
});

describe('outcomes, roles and evidence', () => {
  let task: any;
  beforeAll(async () => {
    const d = await decidedProposal(s(), 'approved-with-conditions');
    task = (await tasksOf(d.proposal.reference)).find((t) => t.kind === 'condition');
  }, 120_000);

  it('readers and writers are checked on the server', async () => {
    expect((await api('GET', '/api/follow-ups')).status).toBe(401);
    expect((await api('GET', '/api/follow-ups', { session: planner })).status).toBe(403);
    expect((await api('GET', `/api/follow-ups/${task.id}`, { session: board })).status).toBe(200);
    expect((await api('GET', `/api/follow-ups/${task.id}`, { session: admin })).status).toBe(200);
    const body = { outcome: 'done', note: '', version: task.version };
    expect((await api('POST', `/api/follow-ups/${task.id}/outcome`, { session: board, body })).status).toBe(403);
    expect((await api('POST', `/api/follow-ups/${task.id}/outcome`, { session: planner, body })).status).toBe(403);
    expect((await upload(task.id, 'site.png', png, planner)).status).toBe(403);
    expect((await api('GET', '/api/follow-ups/999999', { session: assessor })).status).toBe(404);
  });

  it('records an outcome once per version: the second writer with the old version gets 409 and changes nothing', async () => {
    const bad = await api('POST', `/api/follow-ups/${task.id}/outcome`, {
      session: assessor,
      body: { outcome: 'partly', note: '  ', version: task.version },
    });
    expect(bad.status).toBe(422);
    expect(bad.body.error.message).toMatch(/Say what was found/);
    const ok = await api('POST', `/api/follow-ups/${task.id}/outcome`, {
      session: assessor,
      body: { outcome: 'partly', note: 'Margin sown on 40 m of the 120 m watercourse.', version: task.version },
    });
    expect(ok.status).toBe(200);
    expect(ok.body).toMatchObject({
      status: 'partly',
      version: task.version + 1,
      outcomeBy: 'Ada Quill',
      overdue: false,
    });
    const stale = await api('POST', `/api/follow-ups/${task.id}/outcome`, {
      session: chair,
      body: { outcome: 'done', note: '', version: task.version },
    });
    expect(stale.status).toBe(409);
    expect(stale.body.error.message).toMatch(/version/);
    expect((await api('GET', `/api/follow-ups/${task.id}`, { session: chair })).body.status).toBe('partly');
    const done = await api('POST', `/api/follow-ups/${task.id}/outcome`, {
      session: chair,
      body: { outcome: 'done', note: '', version: task.version + 1 },
    });
    expect(done.status).toBe(200);
    expect(
      await testDb('audit_event')
        .where({ action: 'follow-up.outcome', entity_id: String(task.id) })
        .count('* as n')
        .first(),
    ).toMatchObject({ n: 2 });
  });

  it('keeps evidence (PNG by content) with its SHA-256 and serves it back; refuses what is not a PDF, PNG or JPEG', async () => {
    const up = await upload(task.id, 'margin photo.png', png, assessor);
    expect(up.status).toBe(201);
    expect(up.body).toMatchObject({
      mediaType: 'image/png',
      sizeBytes: png.length,
      sha256: createHash('sha256').update(png).digest('hex'),
    });
    const res = await fetch(`${BASE_URL}/api/follow-ups/${task.id}/evidence/${up.body.id}`, {
      headers: { cookie: board.cookie },
    });
    expect(res.status).toBe(200);
    expect(res.headers.get('content-disposition')).toMatch(/^attachment/);
    // RFC 9530 Repr-Digest: sha-256 as base64 between colons.
    expect(res.headers.get('repr-digest')).toBe(`sha-256=:${createHash('sha256').update(png).digest('base64')}:`);
    expect(new Uint8Array(await res.arrayBuffer())).toEqual(png);
    const before = Number((await testDb('follow_up_evidence').count('* as n').first())?.n);
    const html = await upload(task.id, 'report.pdf', new TextEncoder().encode('<!doctype html><p>not a pdf'), assessor);
    expect(html.status).toBe(415);
    expect(html.body.error.message).toMatch(/web page/);
    expect(Number((await testDb('follow_up_evidence').count('* as n').first())?.n)).toBe(before);
    expect((await api('GET', `/api/follow-ups/${task.id}/evidence/not-a-uuid`, { session: board })).status).toBe(422);
    expect((await api('GET', `/api/follow-ups/${task.id}`, { session: board })).body.evidence).toHaveLength(1);
  });
});

describe('overdue tasks and timed notices', () => {
  it('lists open overdue tasks first and flags them; the overdue filter finds only them', async () => {
    const d = await decidedProposal(s(), 'approved-with-conditions');
    const [t] = (await tasksOf(d.proposal.reference)).filter((x) => x.kind === 'condition');
    await testDb('follow_up_task')
      .where({ id: t.id })
      .update({ due_date: addDays(today(), -3) });
    const list = (await api('GET', '/api/follow-ups?pageSize=200', { session: assessor })).body;
    const firstNotOverdue = list.items.findIndex((x: any) => !x.overdue);
    expect(
      list.items
        .slice(0, firstNotOverdue === -1 ? undefined : firstNotOverdue)
        .every((x: any) => x.overdue && x.status === 'open'),
    ).toBe(true);
    expect(list.items.slice(firstNotOverdue).some((x: any) => x.overdue)).toBe(false);
    expect(list.items.find((x: any) => x.id === t.id)).toMatchObject({ overdue: true });
    expect(list.overdueOpen).toBeGreaterThanOrEqual(1);
    const only = (await api('GET', '/api/follow-ups?overdue=true&pageSize=200', { session: assessor })).body;
    expect(only.total).toBe(list.overdueOpen);
    expect(only.items.every((x: any) => x.overdue)).toBe(true);
  }, 120_000);

  it('mails each overdue task once to its assignee role, however often the job runs', async () => {
    const d = await decidedProposal(s(), 'approved-with-conditions');
    const [t] = (await tasksOf(d.proposal.reference)).filter((x) => x.kind === 'condition');
    await testDb('follow_up_task')
      .where({ id: t.id })
      .update({ due_date: addDays(today(), -1) });
    const since = await lastMailId();
    const first = await sendFollowUpOverdueNotices();
    expect(first.overdue).toBeGreaterThanOrEqual(1);
    const mail = await waitForMail(DEMO.assessor, new RegExp(`Follow-up overdue on ${d.proposal.reference}`), since);
    expect(mail.body_text).toContain(CONDITION.text);
    const again = await sendFollowUpOverdueNotices();
    expect(again.overdue).toBe(0);
    const outbox = await testDb('mail_outbox').where('subject', `Follow-up overdue on ${d.proposal.reference}`);
    expect(outbox.map((m) => m.recipient).sort()).toEqual(await usersWith('assessor'));
  }, 120_000);

  it('reminds the assessors and the chair once before a decision deadline, and once when it has passed', async () => {
    const p = await fileProposal(planner, [{ parcelId: await drawParcel(planner) }]);
    await submit(planner, p.id);
    // The reminder setting is 7 days by default (proposal.reminder-days): due in 5 days is inside it.
    await testDb('proposal')
      .where({ id: p.id })
      .update({ decision_due: addDays(today(), 5) });
    const since = await lastMailId();
    expect((await sendDeadlineReminders()).reminders).toBeGreaterThanOrEqual(1);
    await waitForMail(DEMO.chair, new RegExp(`Decision on ${p.reference} due by`), since);
    await waitForMail(DEMO.assessor, new RegExp(`Decision on ${p.reference} due by`), since);
    await sendDeadlineReminders();
    expect(await testDb('mail_outbox').where('subject', 'like', `Decision on ${p.reference} due%`)).toHaveLength(
      new Set([...(await usersWith('assessor')), ...(await usersWith('chair'))]).size,
    );
    await testDb('proposal')
      .where({ id: p.id })
      .update({ decision_due: addDays(today(), -2) });
    await sendDeadlineReminders();
    await sendDeadlineReminders();
    const overdue = await testDb('mail_outbox').where('subject', `Decision on ${p.reference} is overdue`);
    expect(overdue.map((m) => m.recipient).sort()).toEqual(
      [...new Set([...(await usersWith('assessor')), ...(await usersWith('chair'))])].sort(),
    );
    expect(overdue[0].body_text).toContain('2 days ago');
  }, 60_000);
});
