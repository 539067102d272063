/** Invitation, password setting, sign-in, reset and sign-out, end to end through the real server and the SMTP fake. */
import { afterAll, describe, expect, it } from 'vitest';
import { BASE_URL } from '../support/env';
import { api, DEMO, signIn } from '../support/http';
import { lastMailId, linkIn, testDb, waitForMail } from '../support/db';

afterAll(() => testDb.destroy());

const tokenOf = (url: string) => new URL(url).searchParams.get('token')!;

describe('invitation and first password', () => {
  const email = `sorrel.${Date.now()}@tarrow.example`;
  let admin: Awaited<ReturnType<typeof signIn>>;
  let token = '';

  it('an admin invites; the invitee gets a one-time link by e-mail', async () => {
    admin = await signIn(DEMO.admin);
    const before = await lastMailId();
    const res = await api('POST', '/api/users', {
      session: admin,
      body: { name: 'Pia Sorrel', email, roles: ['assessor', 'board'] },
    });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ email, roles: ['assessor', 'board'], status: 'invited' });
    const mail = await waitForMail(email, /Swardkeep account/, before);
    const link = linkIn(mail.body_text);
    expect(link.startsWith(`${BASE_URL}/welcome?token=`)).toBe(true);
    token = tokenOf(link);
    const audit = await testDb('audit_event').where({ action: 'user.invite', entity_id: res.body.id }).first();
    expect(audit).toBeTruthy();
  });

  it('the same address cannot be invited twice', async () => {
    const res = await api('POST', '/api/users', {
      session: admin,
      body: { name: 'Pia Again', email, roles: ['planner'] },
    });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('CONFLICT');
  });

  it('the invitee cannot sign in before choosing a password', async () => {
    const res = await api('POST', '/api/auth/sign-in/email', { body: { email, password: 'anything-at-all-123' } });
    expect(res.status).toBe(401);
  });

  it('a weak password is refused with a clear message and nothing changes', async () => {
    const res = await api('POST', '/api/invitations/accept', { body: { token, password: 'short' } });
    expect(res.status).toBe(422);
    expect(res.body.error.message).toMatch(/at least 10 characters/);
    const common = await api('POST', '/api/invitations/accept', { body: { token, password: 'password123' } });
    expect(common.status).toBe(422);
    expect(common.body.error.message).toMatch(/too common/);
    const inv = await testDb('invitation')
      .whereNotNull('accepted_at')
      .join('user', 'user.id', 'invitation.user_id')
      .where('user.email', email);
    expect(inv).toHaveLength(0);
  });

  it('a good password is accepted; the link then works no more', async () => {
    const ok = await api('POST', '/api/invitations/accept', { body: { token, password: 'hay meadow in june' } });
    expect(ok.status).toBe(200);
    expect(ok.body.email).toBe(email);
    const again = await api('POST', '/api/invitations/accept', { body: { token, password: 'another fine password' } });
    expect(again.status).toBe(410);
    expect(again.body.error.message).toMatch(/already been used/);
    const session = await signIn(email, 'hay meadow in june');
    const me = await api('GET', '/api/me', { session });
    expect(me.body.roles).toEqual(['assessor', 'board']);
  });

  it('an unknown or expired invitation link is refused', async () => {
    const unknown = await api('POST', '/api/invitations/accept', {
      body: { token: 'x'.repeat(43), password: 'hay meadow in june' },
    });
    expect(unknown.status).toBe(404);
    // A link cut off in a mail program reads the same as an unknown one, never a schema message.
    const cut = await api('POST', '/api/invitations/accept', {
      body: { token: 'x'.repeat(6), password: 'hay meadow in june' },
    });
    expect(cut.status).toBe(422);
    // The page shows the field's message (the welcome page, src/lib/auth/form-passwords.ts), which is the unknown link's wording.
    expect(cut.body.error.issues[0].message).toBe(unknown.body.error.message);
    expect(cut.body.error.message).not.toMatch(/expected|>=/i);
    const other = `late.${Date.now()}@tarrow.example`;
    const before = await lastMailId();
    const created = await api('POST', '/api/users', {
      session: admin,
      body: { name: 'Late Comer', email: other, roles: ['planner'] },
    });
    const late = tokenOf(linkIn((await waitForMail(other, /account/, before)).body_text));
    await testDb('invitation')
      .where({ user_id: created.body.id })
      .update({ expires_at: new Date(Date.now() - 1000) });
    const res = await api('POST', '/api/invitations/accept', { body: { token: late, password: 'hay meadow in june' } });
    expect(res.status).toBe(410);
    expect(res.body.error.message).toMatch(/expired/);
  });
});

describe('sign-in, reset and sign-out', () => {
  it('wrong password and unknown user get the same answer', async () => {
    const wrong = await api('POST', '/api/auth/sign-in/email', {
      body: { email: DEMO.planner, password: 'not-the-password' },
    });
    const unknown = await api('POST', '/api/auth/sign-in/email', {
      body: { email: 'nobody@tarrow.example', password: 'not-the-password' },
    });
    expect(wrong.status).toBe(401);
    expect(unknown.status).toBe(401);
    expect(unknown.body.message).toBe(wrong.body.message);
  });

  it('the sign-in page also works as a plain form post (no script), without putting the password in the URL', async () => {
    const form = (password: string) => new URLSearchParams({ email: DEMO.planner, password }).toString();
    const headers = { 'content-type': 'application/x-www-form-urlencoded' };
    const ok = await api('POST', '/sign-in?next=%2Fcalculator', { body: form('meadow-lark-2026'), headers });
    expect(ok.status).toBe(303);
    expect(ok.headers.get('location')).toBe('/calculator');
    const cookie = ok.headers
      .getSetCookie()
      .map((c) => c.split(';')[0])
      .join('; ');
    expect((await api('GET', '/api/me', { session: { cookie } })).body.email).toBe(DEMO.planner);
    const bad = await api('POST', '/sign-in', { body: form('not the password'), headers });
    expect(bad.status).toBe(401);
    expect(bad.body).toMatch(/password is not right/);
  });

  it('the session cookie is HttpOnly and SameSite', async () => {
    const res = await fetch(`${BASE_URL}/api/auth/sign-in/email`, {
      method: 'POST',
      headers: { 'content-type': 'application/json', origin: BASE_URL },
      body: JSON.stringify({ email: DEMO.board, password: 'meadow-lark-2026' }),
    });
    const cookie = res.headers.getSetCookie().find((c) => c.startsWith('better-auth.session_token='))!;
    expect(cookie).toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Lax/i);
  });

  it('password reset by e-mail: link works once, old password stops working', async () => {
    const email = `reset.${Date.now()}@tarrow.example`;
    const admin = await signIn(DEMO.admin);
    let before = await lastMailId();
    await api('POST', '/api/users', { session: admin, body: { name: 'Reset Person', email, roles: ['planner'] } });
    const invite = tokenOf(linkIn((await waitForMail(email, /account/, before)).body_text));
    await api('POST', '/api/invitations/accept', { body: { token: invite, password: 'first password here' } });

    before = await lastMailId();
    const asked = await api('POST', '/api/auth/request-password-reset', {
      body: { email, redirectTo: '/reset-password' },
    });
    expect(asked.status).toBe(200);
    const link = linkIn((await waitForMail(email, /Reset your Swardkeep password/, before)).body_text);
    const follow = await fetch(link, { redirect: 'manual' });
    expect(follow.status).toBe(302);
    const landing = new URL(follow.headers.get('location')!, BASE_URL);
    expect(landing.pathname).toBe('/reset-password');
    const token = landing.searchParams.get('token')!;

    const done = await api('POST', '/api/auth/reset-password', {
      body: { token, newPassword: 'second password here' },
    });
    expect(done.status).toBe(200);
    const reused = await api('POST', '/api/auth/reset-password', {
      body: { token, newPassword: 'third password here' },
    });
    expect(reused.status).toBe(400);
    expect(
      (await api('POST', '/api/auth/sign-in/email', { body: { email, password: 'first password here' } })).status,
    ).toBe(401);
    await signIn(email, 'second password here');
  });

  it('a reset request for an unknown address looks the same as for a known one', async () => {
    const res = await api('POST', '/api/auth/request-password-reset', {
      body: { email: 'nobody@tarrow.example', redirectTo: '/reset-password' },
    });
    expect(res.status).toBe(200);
  });

  it('sign-out ends the session', async () => {
    const session = await signIn(DEMO.planner);
    expect((await api('GET', '/api/me', { session })).status).toBe(200);
    const out = await api('POST', '/sign-out', {
      session,
      body: '',
      headers: { 'content-type': 'application/x-www-form-urlencoded' },
    });
    expect(out.status).toBe(303);
    expect((await api('GET', '/api/me', { session })).status).toBe(401);
  });

  it('a deactivated user is signed out at once and cannot sign in', async () => {
    const admin = await signIn(DEMO.admin);
    const email = `gone.${Date.now()}@tarrow.example`;
    const before = await lastMailId();
    const created = await api('POST', '/api/users', {
      session: admin,
      body: { name: 'Gone Soon', email, roles: ['planner'] },
    });
    const token = tokenOf(linkIn((await waitForMail(email, /account/, before)).body_text));
    await api('POST', '/api/invitations/accept', { body: { token, password: 'temporary meadow pass' } });
    const session = await signIn(email, 'temporary meadow pass');
    const off = await api('PATCH', `/api/users/${created.body.id}`, {
      session: admin,
      body: { version: created.body.version, active: false },
    });
    expect(off.body.status).toBe('deactivated');
    expect((await api('GET', '/api/me', { session })).status).toBe(401);
    expect(
      (await api('POST', '/api/auth/sign-in/email', { body: { email, password: 'temporary meadow pass' } })).status,
    ).toBe(403);
  });

  it('an admin cannot remove their own admin role', async () => {
    const admin = await signIn(DEMO.admin);
    const me = await api('GET', '/api/me', { session: admin });
    const mine = (await api('GET', '/api/users', { session: admin })).body.items.find(
      (u: { id: string }) => u.id === me.body.id,
    );
    const res = await api('PATCH', `/api/users/${me.body.id}`, {
      session: admin,
      body: { version: mine.version, roles: ['planner'] },
    });
    expect(res.status).toBe(409);
  });
});
