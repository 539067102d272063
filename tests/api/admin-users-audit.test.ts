/** Users: role changes name the version they read (409 when stale), are audited as before → after; the audit log filters and pages on the server. */
import { afterAll, describe, expect, it } from 'vitest';
import { lastMailId, testDb, waitForMail } from '../support/db';
import { api, DEMO, signIn } from '../support/http';

afterAll(() => testDb.destroy());

async function invite(name: string) {
  const admin = await signIn(DEMO.admin);
  const email = `${name.toLowerCase().replace(/\W+/g, '.')}.${Date.now()}@tarrow.example`;
  const before = await lastMailId();
  const res = await api('POST', '/api/users', { session: admin, body: { name, email, roles: ['planner'] } });
  expect(res.status).toBe(201);
  await waitForMail(email, /account/, before);
  return { admin, user: res.body };
}

describe('role changes', () => {
  it('need the version read, bump it, and refuse a stale one with 409', async () => {
    const { admin, user } = await invite('Teasel Grange');
    expect(user.version).toBe(1);
    const noVersion = await api('PATCH', `/api/users/${user.id}`, { session: admin, body: { roles: ['board'] } });
    expect(noVersion.status).toBe(422);
    const first = await api('PATCH', `/api/users/${user.id}`, {
      session: admin,
      body: { version: 1, roles: ['planner', 'board'] },
    });
    expect(first.status).toBe(200);
    expect(first.body).toMatchObject({ roles: ['planner', 'board'], version: 2 });
    const stale = await api('PATCH', `/api/users/${user.id}`, {
      session: admin,
      body: { version: 1, roles: ['planner'] },
    });
    expect(stale.status).toBe(409);
    expect(stale.body.error.message).toMatch(/Teasel Grange was changed by someone else/);
    const now = (await api('GET', '/api/users', { session: admin })).body.items.find(
      (u: { id: string }) => u.id === user.id,
    );
    expect(now.roles).toEqual(['planner', 'board']);
    // Undo is a change like any other, from the version now read.
    const undo = await api('PATCH', `/api/users/${user.id}`, {
      session: admin,
      body: { version: 2, roles: ['planner'] },
    });
    expect(undo.body).toMatchObject({ roles: ['planner'], version: 3 });
  });

  it('are audited as the fields changed, before and after', async () => {
    const { admin, user } = await invite('Burnet Hale');
    await api('PATCH', `/api/users/${user.id}`, { session: admin, body: { version: 1, roles: ['board'] } });
    const log = await api('GET', `/api/audit?action=user.update&entityType=user&entityId=${user.id}`, {
      session: admin,
    });
    expect(log.status).toBe(200);
    expect(log.body.total).toBe(1);
    expect(log.body.items[0].details).toEqual({ before: { roles: ['planner'] }, after: { roles: ['board'] } });
  });
});

describe('audit log query', () => {
  it('filters by action, actor, days and record, and pages on the server', async () => {
    const { admin, user } = await invite('Sorrel Voss');
    for (let v = 1; v <= 3; v++)
      await api('PATCH', `/api/users/${user.id}`, {
        session: admin,
        body: { version: v, roles: v % 2 ? ['board'] : ['planner'] },
      });
    const base = `/api/audit?entityType=user&entityId=${user.id}`;
    const all = await api('GET', base, { session: admin });
    expect(all.body.total).toBe(4); // the invitation and three changes
    expect(all.body.items.map((e: { action: string }) => e.action)).toEqual([
      'user.update',
      'user.update',
      'user.update',
      'user.invite',
    ]);

    const p1 = await api('GET', `${base}&pageSize=2&page=1`, { session: admin });
    const p2 = await api('GET', `${base}&pageSize=2&page=2`, { session: admin });
    expect(p1.body).toMatchObject({ total: 4, page: 1, pageSize: 2 });
    expect([...p1.body.items, ...p2.body.items].map((e: { id: number }) => e.id)).toEqual(
      all.body.items.map((e: { id: number }) => e.id),
    );

    const me = (await api('GET', '/api/me', { session: admin })).body;
    expect((await api('GET', `${base}&actor=${me.id}&action=user.invite`, { session: admin })).body.total).toBe(1);
    expect((await api('GET', `${base}&actor=system`, { session: admin })).body.total).toBe(0);
    const today = new Date().toISOString().slice(0, 10);
    expect((await api('GET', `${base}&from=${today}&to=${today}`, { session: admin })).body.total).toBe(4);
    expect((await api('GET', `${base}&to=2020-01-01`, { session: admin })).body.total).toBe(0);
    const bad = await api('GET', '/api/audit?from=2026-02-30', { session: admin });
    expect(bad.status).toBe(422);
  });

  it('documents its filters in OpenAPI', async () => {
    const doc = (await api('GET', '/api/openapi.json')).body;
    const names = doc.paths['/api/audit'].get.parameters.map((p: { name: string }) => p.name);
    expect(names).toEqual(
      expect.arrayContaining(['action', 'actor', 'from', 'to', 'entityType', 'entityId', 'page', 'pageSize']),
    );
  });

  it('is for administrators only', async () => {
    const planner = await signIn(DEMO.planner);
    expect((await api('GET', '/api/audit', { session: planner })).status).toBe(403);
  });
});

describe('map words', () => {
  it('names uploads in words and lists what an upload saved', async () => {
    const planner = await signIn(DEMO.planner);
    const config = await api('GET', '/api/map', { session: planner });
    expect(config.status).toBe(200);
    for (const a of config.body.areas) expect(a.label).not.toMatch(/\.(zip|geojson|json)\b/);
    const upload = config.body.areas.find((a: { id: string | null }) => a.id);
    const one = await api('GET', `/api/map/uploads/${upload.id}`, { session: planner });
    expect(one.status).toBe(200);
    expect(one.body.label).toBe(upload.label);
    expect(one.body.count).toBe(upload.count);
    expect(one.body.parcels.length).toBe(Math.min(upload.count, 2000));
    expect(one.body.parcels[0]).toMatchObject({
      id: expect.any(Number),
      reference: expect.any(String),
      geometry: { type: 'MultiPolygon' },
    });
    expect(JSON.stringify(one.body)).not.toMatch(/owner/i);
    expect(
      (await api('GET', '/api/map/uploads/00000000-0000-4000-8000-000000000000', { session: planner })).status,
    ).toBe(404);
    expect((await api('GET', '/api/map/uploads/not-a-uuid', { session: planner })).status).toBe(422);
    expect((await api('GET', `/api/map/uploads/${upload.id}`)).status).toBe(401);
  });
});
