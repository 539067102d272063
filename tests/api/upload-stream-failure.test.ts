/**
 * The check of an upload streams its features from the worker pool into PostgreSQL chunk by chunk
 * (2,000 features a chunk). When the database refuses a later chunk, the check must end with a
 * clear error, leave the earlier check's staged features as they were (one transaction), record the
 * failure in the upload's progress, and leave the worker pool free: the same check then succeeds.
 * The refusal is made by a trigger this test adds to the real staging table and removes again.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { testDb } from '../support/db';
import { api, DEMO, signIn, type Session } from '../support/http';
import { gridGeoJson } from '../support/upload-grid';
import { uploadFile } from '../support/uploads';

const COUNT = 2500;
const REFUSED_IDX = 2400; // in the second chunk of 2,000
let planner: Session;

async function dropTrigger() {
  await testDb.raw('drop trigger if exists stream_failure_probe on upload_staging_feature');
  await testDb.raw('drop function if exists stream_failure_probe()');
}

beforeAll(async () => {
  planner = await signIn(DEMO.planner);
});
afterAll(async () => {
  await dropTrigger();
  await testDb.destroy();
});

describe('a check that fails part-way through its stream', () => {
  it('rolls back, says so, and leaves the pool able to check again', async () => {
    // 2,500 squares well south of the demo grid (x 0-3000 m, y −12,000 to −9,000 m), clear of other tests' files.
    const staged = await uploadFile(
      planner,
      'stream-failure.geojson',
      gridGeoJson('SFL', COUNT, [0, -12_000], { cols: 50 }),
    );
    expect(staged.status).toBe(201);
    const id: string = staged.body.id;
    const check = () =>
      api('POST', `/api/uploads/${id}/validation`, {
        session: planner,
        body: { layer: staged.body.layers[0].name, mapping: { reference: 'ref' } },
      });

    const first = await check();
    expect(first.status).toBe(200);
    expect(first.body.summary.total).toBe(COUNT);
    const keptBefore = await testDb('upload_staging_feature')
      .where({ staging_id: id })
      .select('idx', 'reference', 'status')
      .orderBy('idx');
    expect(keptBefore).toHaveLength(COUNT);
    const validatedBefore = (await testDb('upload_staging').where({ id }).first()).validated_at;

    await testDb.raw(`
      create function stream_failure_probe() returns trigger language plpgsql as $$
      begin
        if new.idx = ${REFUSED_IDX} then raise exception 'probe: refused feature %', new.idx; end if;
        return new;
      end $$`);
    await testDb.raw(`create trigger stream_failure_probe before insert on upload_staging_feature
      for each row execute function stream_failure_probe()`);
    let failed: { status: number; body: any };
    try {
      failed = await check();
    } finally {
      await dropTrigger();
    }
    // An unexpected database error: the usual 500 answer, logged on the server, no detail leaked.
    expect(failed.status).toBe(500);
    expect(failed.body.error.message).toMatch(/went wrong on the server/);
    expect(JSON.stringify(failed.body)).not.toMatch(/probe/);

    // Nothing of the failed check is left: the earlier check's features and its time are as they were.
    const keptAfter = await testDb('upload_staging_feature')
      .where({ staging_id: id })
      .select('idx', 'reference', 'status')
      .orderBy('idx');
    expect(keptAfter).toEqual(keptBefore);
    expect((await testDb('upload_staging').where({ id }).first()).validated_at).toEqual(validatedBefore);
    const progress = await api('GET', `/api/uploads/${id}`, { session: planner });
    expect(progress.body).toMatchObject({ state: 'failed' });

    // The worker that was stopped part-way is free again: the same check runs to the end.
    const again = await check();
    expect(again.status).toBe(200);
    expect(again.body.summary.total).toBe(COUNT);
    expect(await testDb('upload_staging_feature').where({ staging_id: id }).count('* as n').first()).toEqual({
      n: String(COUNT),
    });
  });
});
