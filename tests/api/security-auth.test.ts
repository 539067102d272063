/**
 * Hardening of sign-in and accounts, through the real server (issue: security hardening, items
 * 1, 4, 5 and the session half of 9): the client address cannot be chosen by the client, failed
 * sign-ins are throttled per account and per address with back-off, one password policy holds on
 * every path, only the auth endpoints we use exist and each is audited, and idle sessions end.
 * Settings are tested at their default and at one other value.
 */
import type { ChildProcess } from 'node:child_process';
import { afterAll, afterEach, describe, expect, it } from 'vitest';
import { appEnv, SECOND_APP_PORT } from '../support/env';
import { api, DEMO, signIn, type Session } from '../support/http';
import { lastMailId, linkIn, testDb, waitForMail } from '../support/db';
import { startAppInstance, stopProcess } from '../support/processes';

const SECOND = `http://127.0.0.1:${SECOND_APP_PORT}`;
const stamp = Date.now();
const nobody = (tag: string) => `${tag}.${stamp}@nowhere.example`;
const guess = (email: string, xff?: string, base?: string) =>
  api('POST', '/api/auth/sign-in/email', {
    base,
    body: { email, password: 'not-the-right-one' },
    headers: xff ? { 'x-forwarded-for': xff } : {},
  });

async function setSetting(key: string, value: unknown): Promise<void> {
  await testDb('app_setting')
    .insert({ key, value: JSON.stringify(value) })
    .onConflict('key')
    .merge();
}
async function clearSettings(): Promise<void> {
  await testDb('app_setting').where('key', 'like', 'auth.%').del();
}

afterEach(async () => {
  await clearSettings();
  await testDb('auth_attempt').del(); // every test starts with no failures counted
});
afterAll(() => testDb.destroy());

describe('client address and throttling (item 1)', () => {
  it('a forged X-Forwarded-For does not reset the sign-in throttle (default: no trusted proxies)', async () => {
    const email = nobody('forged');
    for (let i = 0; i < 5; i++) expect((await guess(email, `203.0.113.${i + 1}`)).status).toBe(401);
    const sixth = await guess(email, '203.0.113.77');
    expect(sixth.status).toBe(429);
    // 30 s from the newest failure (less the seconds a busy test machine takes between guesses).
    expect(Number(sixth.headers.get('retry-after'))).toBeGreaterThanOrEqual(15);
    expect(Number(sixth.headers.get('retry-after'))).toBeLessThanOrEqual(30);
    expect(sixth.body.message).toMatch(/Wait \d+ seconds/);
    // The failures were counted against the socket address, not the forged ones.
    const keys = (await testDb('auth_attempt').distinct('key')).map((r) => r.key);
    expect(keys.filter((k: string) => k.startsWith('sign-in:address:'))).toEqual(['sign-in:address:127.0.0.1']);
  });

  it('the audit log records the real client address, not a forged X-Forwarded-For', async () => {
    const res = await api('POST', '/api/auth/sign-in/email', {
      body: { email: DEMO.chair, password: 'meadow-lark-2026' },
      headers: { 'x-forwarded-for': '198.51.100.23' },
    });
    expect(res.status).toBe(200);
    const row = await testDb('audit_event')
      .where({ action: 'user.sign-in', entity_id: res.body.user.id })
      .orderBy('id', 'desc')
      .first();
    expect(row.details.ip).toBe('127.0.0.1');
  });

  it('waits grow after repeated failures on one account, and the right password waits too', async () => {
    const email = DEMO.assessor;
    for (let i = 0; i < 5; i++) expect((await guess(email)).status).toBe(401);
    const first = await guess(email);
    expect(first.status).toBe(429);
    const firstWait = Number(first.headers.get('retry-after'));
    expect(firstWait).toBeGreaterThan(15);
    expect(firstWait).toBeLessThanOrEqual(30);
    expect(
      (await api('POST', '/api/auth/sign-in/email', { body: { email, password: 'meadow-lark-2026' } })).status,
    ).toBe(429);
    // Let the first wait pass (move the recorded failures back in time), fail once more: the next wait doubles.
    await testDb('auth_attempt').update({ at: testDb.raw(`at - interval '31 seconds'`) });
    expect((await guess(email)).status).toBe(401);
    const second = await guess(email);
    expect(second.status).toBe(429);
    expect(Number(second.headers.get('retry-after'))).toBeGreaterThan(40);
    expect(Number(second.headers.get('retry-after'))).toBeLessThanOrEqual(60);
    // After the wait, the right password works and clears the account's count.
    await testDb('auth_attempt').update({ at: testDb.raw(`at - interval '61 seconds'`) });
    expect(
      (await api('POST', '/api/auth/sign-in/email', { body: { email, password: 'meadow-lark-2026' } })).status,
    ).toBe(200);
    expect(
      await testDb('auth_attempt')
        .where({ key: `sign-in:account:${email}` })
        .first(),
    ).toBeUndefined();
  });

  it('a busy office behind one address is not locked out by its typos (default: 30 per address, 5 per account)', async () => {
    // Twenty people each mistype once within a minute; each one's next try is judged on its own.
    for (let i = 0; i < 20; i++) expect((await guess(nobody(`office${i}`))).status).toBe(401);
    for (let i = 0; i < 4; i++) expect((await guess(nobody('office0'))).status).toBe(401);
    expect(
      (await api('POST', '/api/auth/sign-in/email', { body: { email: DEMO.board, password: 'meadow-lark-2026' } }))
        .status,
    ).toBe(200);
  });

  it('many accounts guessed from one address are throttled by address (setting at another value: 3)', async () => {
    await setSetting('auth.throttle.address-free-failures', 3);
    for (let i = 0; i < 3; i++) expect((await guess(nobody(`spray${i}`))).status).toBe(401);
    expect((await guess(nobody('spray-next'))).status).toBe(429);
  });

  it('the account allowance is a setting (another value: 2 failures before the first wait)', async () => {
    await setSetting('auth.throttle.account-free-failures', 2);
    await setSetting('auth.throttle.first-delay-seconds', 120);
    const email = nobody('strict');
    for (let i = 0; i < 2; i++) expect((await guess(email)).status).toBe(401);
    const res = await guess(email);
    expect(res.status).toBe(429);
    expect(Number(res.headers.get('retry-after'))).toBeGreaterThan(90);
    expect(res.body.message).toMatch(/Wait \d+ (seconds|minutes)/);
  });

  it('reset mails to one address are limited per account, whatever X-Forwarded-For says', async () => {
    const email = nobody('reset');
    for (let i = 0; i < 3; i++) {
      const res = await api('POST', '/api/auth/request-password-reset', {
        body: { email, redirectTo: '/reset-password' },
        headers: { 'x-forwarded-for': `192.0.2.${i}` },
      });
      expect(res.status).toBe(200);
    }
    const fourth = await api('POST', '/api/auth/request-password-reset', {
      body: { email, redirectTo: '/reset-password' },
      headers: { 'x-forwarded-for': '192.0.2.99' },
    });
    expect(fourth.status).toBe(429);
  });
});

describe('trusted proxies (item 1, the setting at another value)', () => {
  let second: ChildProcess | undefined;
  afterEach(async () => {
    await stopProcess(second);
    second = undefined;
  });

  async function startWith(trusted: string): Promise<void> {
    second = await startAppInstance(
      { ...appEnv(SECOND_APP_PORT), TRUSTED_PROXIES: trusted, MAIL_WORKER: 'off' },
      SECOND_APP_PORT,
    );
  }

  it('behind a trusted proxy (TRUSTED_PROXIES=loopback) the forwarded address is the client, for the audit and the throttle', async () => {
    await startWith('loopback');
    const res = await api('POST', '/api/auth/sign-in/email', {
      base: SECOND,
      body: { email: DEMO.chair, password: 'meadow-lark-2026' },
      headers: { 'x-forwarded-for': '198.51.100.7' },
    });
    expect(res.status).toBe(200);
    const row = await testDb('audit_event')
      .where({ action: 'user.sign-in', entity_id: res.body.user.id })
      .orderBy('id', 'desc')
      .first();
    expect(row.details.ip).toBe('198.51.100.7');
    // A rotating client address still meets the per-account throttle.
    const email = nobody('rotating');
    for (let i = 0; i < 5; i++) expect((await guess(email, `198.51.100.${10 + i}`, SECOND)).status).toBe(401);
    expect((await guess(email, '198.51.100.99', SECOND)).status).toBe(429);
    const keys = (await testDb('auth_attempt').distinct('key')).map((r) => r.key as string);
    expect(keys).toContain('sign-in:address:198.51.100.10');
  });

  it('a hop count (TRUSTED_PROXIES=1) takes the address the nearest proxy saw, not one the client wrote', async () => {
    await startWith('1');
    const res = await api('POST', '/api/auth/sign-in/email', {
      base: SECOND,
      body: { email: DEMO.chair, password: 'meadow-lark-2026' },
      headers: { 'x-forwarded-for': '203.0.113.5, 198.51.100.8' },
    });
    expect(res.status).toBe(200);
    const row = await testDb('audit_event')
      .where({ action: 'user.sign-in', entity_id: res.body.user.id })
      .orderBy('id', 'desc')
      .first();
    expect(row.details.ip).toBe('198.51.100.8');
  });
});

describe('one password policy (item 4)', () => {
  async function inviteAndToken(admin: Session, email: string): Promise<string> {
    const before = await lastMailId();
    await api('POST', '/api/users', { session: admin, body: { name: 'Policy Person', email, roles: ['planner'] } });
    return new URL(linkIn((await waitForMail(email, /account/, before)).body_text)).searchParams.get('token')!;
  }

  it('a common or easily guessed password is refused on invitation and on reset, in plain words', async () => {
    const admin = await signIn(DEMO.admin);
    const email = `policy.${stamp}@tarrow.example`;
    const invite = await inviteAndToken(admin, email);
    const common = await api('POST', '/api/invitations/accept', { body: { token: invite, password: 'Password1!' } });
    expect(common.status).toBe(422);
    expect(common.body.error.message).toMatch(/too common/);
    const own = await api('POST', '/api/invitations/accept', { body: { token: invite, password: 'policyperson1' } });
    expect(own.status).toBe(422);
    expect(
      (await api('POST', '/api/invitations/accept', { body: { token: invite, password: 'lark over the wet meadow' } }))
        .status,
    ).toBe(200);

    const before = await lastMailId();
    await api('POST', '/api/auth/request-password-reset', { body: { email, redirectTo: '/reset-password' } });
    const link = linkIn((await waitForMail(email, /Reset your Swardkeep password/, before)).body_text);
    const token = new URL(
      (await fetch(link, { redirect: 'manual' })).headers.get('location')!,
      SECOND,
    ).searchParams.get('token')!;
    for (const weak of ['aaaaaaaaaa', 'Password1!', '1234567890']) {
      const res = await api('POST', '/api/auth/reset-password', { body: { token, newPassword: weak } });
      expect(res.status, weak).toBe(400);
      expect(res.body.code).toBe('PASSWORD_TOO_WEAK');
      expect(res.body.message).toMatch(/too common|too easy to guess/);
    }
    expect(
      (await api('POST', '/api/auth/reset-password', { body: { token, newPassword: 'swallows nest under eaves' } }))
        .status,
    ).toBe(200);
    await signIn(email, 'swallows nest under eaves');
  });
});

describe('auth endpoints (item 5)', () => {
  it('auth endpoints Swardkeep does not use answer 404 and change nothing', async () => {
    const planner = await signIn(DEMO.planner);
    const admin = await signIn(DEMO.admin);
    const before = await testDb('user').where({ email: DEMO.planner }).first('name', 'role');
    const calls: [Session, string, unknown][] = [
      [planner, '/api/auth/update-user', { name: 'Somebody Else' }],
      [planner, '/api/auth/change-password', { currentPassword: 'meadow-lark-2026', newPassword: 'aaaaaaaaaa' }],
      [admin, '/api/auth/admin/impersonate-user', { userId: 'x' }],
      [admin, '/api/auth/admin/set-user-password', { userId: 'x', newPassword: 'aaaaaaaaaa' }],
      [admin, '/api/auth/admin/set-role', { userId: 'x', role: 'admin' }],
      [planner, '/api/auth/sign-up/email', { email: nobody('signup'), password: 'a long enough password', name: 'X' }],
    ];
    for (const [session, path, body] of calls) {
      const res = await api('POST', path, { session, body });
      expect(res.status, path).toBe(404);
    }
    expect((await api('GET', '/api/auth/list-sessions', { session: planner })).status).toBe(404);
    expect(await testDb('user').where({ email: DEMO.planner }).first('name', 'role')).toEqual(before);
  });

  it('the auth endpoints that remain are audited with the real actor', async () => {
    const session = await signIn(DEMO.board);
    const me = await api('GET', '/api/me', { session });
    const out = await api('POST', '/api/auth/sign-out', { session, body: {} });
    expect(out.status).toBe(200);
    const signOut = await testDb('audit_event')
      .where({ action: 'user.sign-out', actor_id: me.body.id })
      .orderBy('id', 'desc')
      .first();
    expect(signOut).toBeTruthy();
    await api('POST', '/api/auth/request-password-reset', {
      body: { email: DEMO.board, redirectTo: '/reset-password' },
    });
    const asked = await testDb('audit_event')
      .where({ action: 'user.password-reset-request', entity_id: me.body.id })
      .first();
    expect(asked.details.ip).toBe('127.0.0.1');
    const signInRow = await testDb('audit_event').where({ action: 'user.sign-in', actor_id: me.body.id }).first();
    expect(signInRow).toBeTruthy();
  });
});

describe('session idle timeout (item 9)', () => {
  async function idleFor(session: Session, minutes: number): Promise<void> {
    const token = decodeURIComponent(session.cookie.split('better-auth.session_token=')[1]!.split(';')[0]!).split(
      '.',
    )[0]!;
    await testDb('session')
      .where({ token })
      .update({ updatedAt: testDb.raw(`now() - make_interval(mins => ?)`, [minutes]) });
  }

  it('by default a session survives a working day of idleness (8 hours) but not more', async () => {
    const kept = await signIn(DEMO.planner);
    await idleFor(kept, 8 * 60 - 5);
    expect((await api('GET', '/api/me', { session: kept })).status).toBe(200);
    const ended = await signIn(DEMO.planner);
    await idleFor(ended, 8 * 60 + 5);
    expect((await api('GET', '/api/me', { session: ended })).status).toBe(401);
    expect((await api('GET', '/api/me', { session: ended })).status).toBe(401);
  });

  it('with the idle timeout set to 30 minutes, 31 idle minutes end the session and 25 do not', async () => {
    await setSetting('auth.session.idle-minutes', 30);
    const kept = await signIn(DEMO.planner);
    await idleFor(kept, 25);
    expect((await api('GET', '/api/me', { session: kept })).status).toBe(200);
    const ended = await signIn(DEMO.planner);
    await idleFor(ended, 31);
    expect((await api('GET', '/api/me', { session: ended })).status).toBe(401);
  });
});
