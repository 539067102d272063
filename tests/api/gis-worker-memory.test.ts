/**
 * The GIS threads run with a heap limit (GIS_WORKER_HEAP_MB, src/lib/workers/pool.ts). A file whose
 * reading needs more than the limit must end in a clear 413 that asks for smaller files, store
 * nothing, and leave the pool working: the next small upload on the same instance is read as usual.
 * A second instance runs with a 32 MB limit so that an ordinary-sized file passes it.
 */
import type { ChildProcess } from 'node:child_process';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { testDb } from '../support/db';
import { appEnv, SECOND_APP_PORT } from '../support/env';
import { DEMO, signIn, type Session } from '../support/http';
import { stopProcess, startAppInstance } from '../support/processes';
import { gridGeoJson } from '../support/upload-grid';

const BASE = `http://127.0.0.1:${SECOND_APP_PORT}`;
let instance: ChildProcess;
let planner: Session;

async function upload(fileName: string, text: string): Promise<{ status: number; body: any }> {
  const form = new FormData();
  form.set('purpose', 'parcels');
  form.set('file', new Blob([text]), fileName);
  const res = await fetch(`${BASE}/api/uploads`, {
    method: 'POST',
    headers: { cookie: planner.cookie, origin: BASE },
    body: form,
  });
  return { status: res.status, body: await res.json() };
}

const stagedCount = async () => Number((await testDb('upload_staging').count('* as n').first())?.n ?? 0);

beforeAll(async () => {
  instance = await startAppInstance(
    { ...appEnv(SECOND_APP_PORT), MAIL_WORKER: 'off', JOB_QUEUE: 'off', GIS_WORKER_HEAP_MB: '32' },
    SECOND_APP_PORT,
  );
  planner = await signIn(DEMO.planner, undefined, BASE);
});
afterAll(async () => {
  await stopProcess(instance);
  await testDb.destroy();
});

describe('a GIS thread that runs out of memory', () => {
  it('answers 413 asking for smaller files, stores nothing, and the next upload is read', async () => {
    const before = await stagedCount();
    // 60,000 squares: about 14 MB of GeoJSON, far more than 32 MB of heap once parsed into objects.
    const big = await upload('too-big.geojson', gridGeoJson('OOM', 60_000, [0, -30_000], { cols: 250 }));
    expect(big.status).toBe(413);
    expect(big.body.error.message).toMatch(/ran out of memory\. Split it into smaller files/);
    expect(await stagedCount()).toBe(before);

    const small = await upload('small-after.geojson', gridGeoJson('AFT', 3, [0, -30_000]));
    expect(small.status).toBe(201);
    expect(small.body.layers[0].featureCount).toBe(3);
    expect(await stagedCount()).toBe(before + 1);
    await testDb('upload_staging').where({ id: small.body.id }).delete();
  });
});
