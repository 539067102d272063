/** The Knex migration owns better-auth's tables; this fails when better-auth expects anything else. */
import { afterAll, describe, expect, it } from 'vitest';
import { appEnv } from '../support/env';

Object.assign(process.env, appEnv());
const { getMigrations } = await import('better-auth/db/migration');
const { auth } = await import('~/lib/auth/auth');
const { db } = await import('~/lib/db/client');

afterAll(() => db.destroy());

describe('better-auth schema', () => {
  it('needs no table, column or index beyond our migrations', async () => {
    const m = await getMigrations(auth.options);
    expect(m.toBeCreated.map((t: { table: string }) => t.table)).toEqual([]);
    expect(m.toBeAdded.map((t: { table: string }) => t.table)).toEqual([]);
  });
});
