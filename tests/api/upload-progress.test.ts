/**
 * An upload's long work is stored in PostgreSQL as it goes (GET /api/uploads/{id}): the phases of
 * the check and the save appear while the request runs and end in saved; only the uploader and
 * administrators read them (404 for another planner and for an unknown id); a returning user
 * finds an earlier upload where it was left (its report, or what the save did).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { lastMailId, linkIn, testDb, waitForMail } from '../support/db';
import { api, DEMO, signIn, type Session } from '../support/http';
import { gridGeoJson } from '../support/upload-grid';
import { uploadFile } from '../support/uploads';

const COUNT = 4000;
let planner: Session;
let admin: Session;

/** A second planner, invited by the admin and signed in with the password chosen from the link. */
async function secondPlanner(): Promise<Session> {
  const email = `bryony.stell.${Date.now()}@tarrow.example`;
  const before = await lastMailId();
  const res = await api('POST', '/api/users', {
    session: admin,
    body: { name: 'Bryony Stell', email, roles: ['planner'] },
  });
  expect(res.status).toBe(201);
  const token = new URL(linkIn((await waitForMail(email, /account/, before)).body_text)).searchParams.get('token');
  const password = 'quiet-sedge-meadow-2026';
  expect((await api('POST', '/api/invitations/accept', { body: { token, password } })).status).toBe(200);
  return signIn(email, password);
}

/** Polls the upload's state while `work` runs and returns everything seen, then the work's answer. */
async function watch(session: Session, id: string, work: Promise<{ status: number; body: any }>) {
  const seen: any[] = [];
  let finished = false;
  const answer = work.finally(() => (finished = true));
  while (!finished) {
    const r = await api('GET', `/api/uploads/${id}`, { session });
    expect(r.status).toBe(200);
    seen.push(r.body);
    await new Promise((ok) => setTimeout(ok, 40));
  }
  return { seen, answer: await answer };
}

beforeAll(async () => {
  [planner, admin] = await Promise.all([signIn(DEMO.planner), signIn(DEMO.admin)]);
});
afterAll(() => testDb.destroy());

describe('upload progress', () => {
  let id: string;
  let batchId: string;

  it('records the check as it runs, then the report', async () => {
    // 4,000 squares south of the demo grid (x 0-4800 m, y −4700 to −1760 m), clear of other tests' parcels.
    const staged = await uploadFile(planner, 'progress-grid.geojson', gridGeoJson('PRG', COUNT, [0, -4700]));
    expect(staged.status).toBe(201);
    id = staged.body.id;
    const before = await api('GET', `/api/uploads/${id}`, { session: planner });
    expect(before.status).toBe(200);
    expect(before.body).toMatchObject({ id, state: 'staged', phase: 'staged', fileName: 'progress-grid.geojson' });
    expect(before.body.staged.layers[0].featureCount).toBe(COUNT);
    expect(before.body.report).toBeNull();

    const check = api('POST', `/api/uploads/${id}/validation`, {
      session: planner,
      body: { layer: staged.body.layers[0].name, mapping: { reference: 'ref' } },
    });
    const { seen, answer } = await watch(planner, id, check);
    expect(answer.status).toBe(200);
    expect(answer.body.summary).toMatchObject({ total: COUNT, rejected: 0 });
    const running = seen.filter((s) => s.state === 'running');
    expect(running.length).toBeGreaterThan(0);
    for (const s of running) expect(['checking', 'keeping', 'comparing']).toContain(s.phase);
    // Once the file is read the total is known, and counts never pass it.
    expect(running.some((s) => s.total === COUNT)).toBe(true);
    for (const s of running) if (s.done !== null) expect(s.done).toBeLessThanOrEqual(s.total);
    const startedAt = new Set(running.map((s) => s.startedAt));
    expect(startedAt.size).toBe(1);

    const after = await api('GET', `/api/uploads/${id}`, { session: planner });
    expect(after.body).toMatchObject({ state: 'validated', phase: 'validated', done: COUNT, total: COUNT });
    expect(after.body.report.summary).toEqual(answer.body.summary);
    expect(after.body.report.features).toEqual(answer.body.features);
    expect(after.body.choice).toMatchObject({
      layer: staged.body.layers[0].name,
      epsg: null,
      mapping: { reference: 'ref' },
    });
  });

  it('records the save and ends in saved, with the batch', async () => {
    const { seen, answer } = await watch(planner, id, api('POST', `/api/uploads/${id}/save`, { session: planner }));
    expect(answer.status).toBe(201);
    batchId = answer.body.batchId;
    for (const s of seen.filter((x) => x.state === 'running')) expect(['storing', 'overlay']).toContain(s.phase);
    const done = await api('GET', `/api/uploads/${id}`, { session: planner });
    expect(done.body).toMatchObject({
      state: 'saved',
      phase: 'saved',
      staged: null,
      report: null,
      saved: { batchId, saved: COUNT, rejected: 0, referenceVersion: null },
    });
    const rows = await testDb('upload_progress').where({ upload_id: id });
    expect(rows).toHaveLength(1);
  });

  it('is the uploader’s: another planner gets 404, an admin may read it, an unknown id is 404', async () => {
    const other = await secondPlanner();
    const theirs = await api('GET', `/api/uploads/${id}`, { session: other });
    expect(theirs.status).toBe(404);
    expect(theirs.body.error.code).toBe('NOT_FOUND');
    expect(JSON.stringify(theirs.body)).not.toContain('progress-grid');
    expect((await api('GET', `/api/uploads/${id}`, { session: admin })).body.state).toBe('saved');
    const unknown = await api('GET', '/api/uploads/00000000-0000-4000-8000-000000000000', { session: planner });
    expect(unknown.status).toBe(404);
    expect((await api('GET', '/api/uploads/not-a-uuid', { session: planner })).status).toBe(422);
    // Someone else's staged upload is as unknown as a wrong id, before and after a check.
    const staged = await uploadFile(other, 'theirs.geojson', gridGeoJson('THR', 2, [5200, -3000]));
    expect((await api('GET', `/api/uploads/${staged.body.id}`, { session: planner })).status).toBe(404);
    expect((await api('GET', `/api/uploads/${staged.body.id}`, { session: other })).body.state).toBe('staged');
  });

  it('lets a returning user re-open an earlier upload where it was left', async () => {
    const staged = await uploadFile(planner, 'left-checked.geojson', gridGeoJson('LFT', 3, [5200, -3400]));
    const check = await api('POST', `/api/uploads/${staged.body.id}/validation`, {
      session: planner,
      body: { layer: staged.body.layers[0].name, mapping: { reference: 'ref' } },
    });
    expect(check.status).toBe(200);
    // A new session (another day, another browser): the checked upload and the saved one are there.
    const again = await signIn(DEMO.planner);
    const left = await api('GET', `/api/uploads/${staged.body.id}`, { session: again });
    expect(left.body).toMatchObject({ state: 'validated', report: { summary: { total: 3, ok: 3 } } });
    const saved = await api('GET', `/api/uploads/${id}`, { session: again });
    expect(saved.body.saved.batchId).toBe(batchId);
  });

  it('keeps a failed step’s message, and a cancelled upload says so', async () => {
    const staged = await uploadFile(planner, 'bad-mapping.geojson', gridGeoJson('BAD', 2, [5200, -3800]));
    const bad = await api('POST', `/api/uploads/${staged.body.id}/validation`, {
      session: planner,
      body: { layer: staged.body.layers[0].name, mapping: { reference: 'no_such_column' } },
    });
    expect(bad.status).toBe(422);
    const failed = await api('GET', `/api/uploads/${staged.body.id}`, { session: planner });
    expect(failed.body).toMatchObject({ state: 'failed', failedIn: 'checking', message: bad.body.error.message });
    expect(failed.body.staged).not.toBeNull();
    expect((await api('DELETE', `/api/uploads/${staged.body.id}`, { session: planner })).status).toBe(204);
    const gone = await api('GET', `/api/uploads/${staged.body.id}`, { session: planner });
    expect(gone.body).toMatchObject({ state: 'cancelled', staged: null });
  });

  it('leaves nothing behind when the file is refused', async () => {
    const before = Number((await testDb('upload_progress').count('* as n').first())?.n);
    const refused = await uploadFile(planner, 'broken.geojson', '{"type": "FeatureCollection", "features": [');
    expect(refused.status).toBe(422);
    expect(Number((await testDb('upload_progress').count('* as n').first())?.n)).toBe(before);
  });
});
