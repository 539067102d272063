/**
 * Restarting on the same database: what an operator does after Ctrl-C. Runs on its own database
 * (not the shared test database) so that it can migrate, seed and start `npm start` twice.
 */
import { execFile, spawn } from 'node:child_process';
import { promisify } from 'node:util';
import knexFactory, { type Knex } from 'knex';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { APP_PORT, appEnv, TEST_DATABASE_URL } from '../support/env';

const run = promisify(execFile);
const NAME = `swardkeep_test_restart${APP_PORT}`;
const url = new URL(TEST_DATABASE_URL);
const adminUrl = Object.assign(new URL(url), { pathname: '/postgres' }).toString();
const dbUrl = Object.assign(new URL(url), { pathname: `/${NAME}` }).toString();
const env = { ...appEnv(), DATABASE_URL: dbUrl, SWARDKEEP_LOCAL_DB: '1' };
let conn: Knex;

async function script(file: string, ...args: string[]): Promise<{ stdout: string; stderr: string }> {
  return run(process.execPath, ['--import', 'tsx', file, ...args], { env, timeout: 240_000 });
}

/** Row count of every table and the newest audit row: what a second run must leave alone. */
async function snapshot(): Promise<Record<string, number>> {
  const tables = await conn.raw("select tablename from pg_tables where schemaname = 'public' order by 1");
  const out: Record<string, number> = {};
  for (const { tablename } of tables.rows as { tablename: string }[]) {
    const [{ n }] = await conn(tablename).count<{ n: string }[]>('* as n');
    out[tablename] = Number(n);
  }
  out['audit_event.max_id'] = Number((await conn('audit_event').max('id as id').first())?.id ?? 0);
  return out;
}

beforeAll(async () => {
  const admin = knexFactory({ client: 'pg', connection: adminUrl, pool: { min: 0, max: 1 } });
  await admin.raw(`drop database if exists ${NAME} with (force)`);
  await admin.raw(`create database ${NAME}`);
  await admin.destroy();
  conn = knexFactory({ client: 'pg', connection: dbUrl, pool: { min: 0, max: 2 } });
}, 60_000);

afterAll(async () => {
  await conn?.destroy();
  const admin = knexFactory({ client: 'pg', connection: adminUrl, pool: { min: 0, max: 1 } });
  await admin.raw(`drop database if exists ${NAME} with (force)`);
  await admin.destroy();
});

describe('restart on the same database', () => {
  it('migrate and seed run twice on a seeded database; the second run changes nothing', async () => {
    await script('scripts/migrate.ts', 'latest');
    await script('scripts/seed.ts');
    const first = await snapshot();
    expect(first.parcel).toBeGreaterThan(0);
    expect(first.factor_set_version).toBeGreaterThanOrEqual(2);
    const again = await script('scripts/migrate.ts', 'latest');
    expect(again.stdout).toContain('migrate: up to date');
    expect(again.stderr).not.toMatch(/differs/);
    const seed = await script('scripts/seed.ts');
    expect(seed.stdout).toContain('demo data not added');
    expect(await snapshot()).toEqual(first);
  }, 240_000);

  it('a shipped factor set really changed without a new version number is still refused', async () => {
    const { syncShippedSets } = await import('~/lib/services/factor-sets');
    const { IPCC_2006 } = await import('~/lib/carbon');
    const changed = structuredClone(IPCC_2006);
    const entry = changed.tables[0]!.entries.find((e) => typeof e.value === 'number')!;
    entry.value = (entry.value as number) + 1;
    await expect(syncShippedSets(conn, [changed])).rejects.toThrow(/ipcc-2006 version 1 differs from the stored one/);
    // The unchanged file, and the same content with its keys in another order, pass.
    const reordered = Object.fromEntries(Object.entries(structuredClone(IPCC_2006)).reverse()) as typeof IPCC_2006;
    await expect(syncShippedSets(conn, [IPCC_2006, reordered])).resolves.toEqual([]);
  });

  it('`npm start` comes up twice in a row on one database', async () => {
    const port = APP_PORT + 50;
    for (const attempt of [1, 2]) {
      const child = spawn('bash', ['scripts/start.sh'], {
        env: {
          ...env,
          PORT: String(port),
          SMTP_PORT: String(port + 1),
          SMTP_HOST: '',
          BETTER_AUTH_URL: `http://127.0.0.1:${port}`,
        },
        stdio: ['ignore', 'pipe', 'pipe'],
      });
      let output = '';
      child.stdout.on('data', (b) => (output += b));
      child.stderr.on('data', (b) => (output += b));
      const exited = new Promise<number | null>((r) => child.once('exit', (code) => r(code)));
      const deadline = Date.now() + 180_000;
      while (!output.includes('Press Ctrl-C to stop')) {
        if (child.exitCode !== null || Date.now() > deadline)
          throw new Error(`start ${attempt} did not come up:\n${output}`);
        await new Promise((r) => setTimeout(r, 200));
      }
      const health = await fetch(`http://127.0.0.1:${port}/api/health`);
      expect(health.status, `start ${attempt}`).toBe(200);
      expect(output).toContain(attempt === 1 ? 'migrate: up to date' : 'demo data not added');
      expect(output).not.toMatch(/differs from the stored one/);
      child.kill('SIGINT');
      await exited;
      // Ctrl-C stops the app: the port is free again for the next start.
      await expect(fetch(`http://127.0.0.1:${port}/api/health`)).rejects.toThrow();
    }
  }, 420_000);
});
