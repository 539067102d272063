/**
 * `npm run db backup` / `npm run db restore` round-trip the seeded demo database: restored into a
 * scratch database, every table holds the same rows (counts and a hash of each key table's rows),
 * the register's hash chain is intact, and a restore with --clean repairs a damaged copy.
 */
import { execFileSync, spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, statSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import pg from 'pg';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { entryHash } from '~/lib/register/chain';
import { TEST_DATABASE_URL } from '../support/env';

const SCRATCH = 'swardkeep_test_restore';
const scratchUrl = (() => {
  const u = new URL(TEST_DATABASE_URL);
  u.pathname = `/${SCRATCH}`;
  return u.toString();
})();
const dir = mkdtempSync(path.join(os.tmpdir(), 'swardkeep-backup-'));
const file = path.join(dir, 'demo.dump');

function db(args: string[], databaseUrl: string) {
  return spawnSync(process.execPath, ['--import', 'tsx', 'scripts/db.ts', ...args], {
    encoding: 'utf8',
    env: { ...process.env, DATABASE_URL: databaseUrl, SWARDKEEP_LOCAL_DB: '' },
  });
}

/** Row count and an order-independent hash of every row, per table of the public and pgboss schemas. */
async function fingerprint(url: string): Promise<Record<string, string>> {
  const client = new pg.Client({ connectionString: url });
  await client.connect();
  try {
    const tables = await client.query<{ s: string; t: string }>(
      "select table_schema as s, table_name as t from information_schema.tables where table_schema in ('public', " +
        "'pgboss') and table_type = 'BASE TABLE' order by 1, 2",
    );
    const out: Record<string, string> = {};
    for (const { s, t } of tables.rows) {
      const r = await client.query(
        `select count(*)::int as n, coalesce(md5(string_agg(md5(x::text), '' order by md5(x::text))), '') as h from "${s}"."${t}" x`,
      );
      out[`${s}.${t}`] = `${r.rows[0].n}:${r.rows[0].h}`;
    }
    return out;
  } finally {
    await client.end();
  }
}

async function withClient<T>(url: string, fn: (c: pg.Client) => Promise<T>): Promise<T> {
  const c = new pg.Client({ connectionString: url });
  await c.connect();
  try {
    return await fn(c);
  } finally {
    await c.end();
  }
}

const adminUrl = (() => {
  const u = new URL(TEST_DATABASE_URL);
  u.pathname = '/postgres';
  return u.toString();
})();

beforeAll(() => withClient(adminUrl, (c) => c.query(`drop database if exists ${SCRATCH} with (force)`)));
afterAll(async () => {
  await withClient(adminUrl, (c) => c.query(`drop database if exists ${SCRATCH} with (force)`));
  rmSync(dir, { recursive: true, force: true });
});

describe('db backup and restore', () => {
  let source: Record<string, string>;

  it('backs the demo database up into one custom-format file', async () => {
    source = await fingerprint(TEST_DATABASE_URL);
    const r = db(['backup', file], TEST_DATABASE_URL);
    expect(r.status, r.stderr).toBe(0);
    expect(r.stdout).toContain('backup of swardkeep_test written to');
    expect(statSync(file).size).toBeGreaterThan(10_000);
    // pg_dump's custom format starts with "PGDMP" (PostgreSQL documentation, pg_dump -Fc).
    const list = execFileSync('bash', ['-c', `head -c 5 "${file}"`], { encoding: 'utf8' });
    expect(list).toBe('PGDMP');
    expect(r.stdout + r.stderr).not.toContain('postgres:postgres');
  });

  it('restores into a missing database with every table and row the same', async () => {
    const r = db(['restore', file], scratchUrl);
    expect(r.status, r.stderr).toBe(0);
    const restored = await fingerprint(scratchUrl);
    // Tables the app wrote while the backup ran (sessions, queue polling) may differ; the domain must not.
    for (const key of [
      'public.parcel',
      'public.proposal',
      'public.assessment',
      'public.register_entry',
      'public.audit_event',
      'public.land_use_event',
      'public.board_decision',
      'public.knex_migrations',
      'public.user',
    ]) {
      expect(restored[key], key).toBe(source[key]);
    }
    expect(Object.keys(restored).sort()).toEqual(Object.keys(source).sort());
    expect(Number(restored['public.register_entry'].split(':')[0])).toBeGreaterThan(0);
  });

  it('keeps the register hash chain intact and the geometries exact', async () => {
    const chain = await withClient(scratchUrl, (c) =>
      c.query<{ seq: number; prev_hash: string; hash: string; content: unknown }>(
        'select seq::int, prev_hash, hash, content from register_entry order by seq',
      ),
    );
    let prev = '0'.repeat(64);
    for (const row of chain.rows) {
      expect(row.prev_hash, `entry ${row.seq}`).toBe(prev);
      expect(entryHash(row.seq, row.prev_hash, row.content), `entry ${row.seq}`).toBe(row.hash);
      prev = row.hash;
    }
    // The register stays insert-only for its writer role (grants are restored).
    const grants = await withClient(scratchUrl, (c) =>
      c.query(
        "select has_table_privilege('swardkeep_register_writer', 'register_entry', 'INSERT') as ins, " +
          "has_table_privilege('swardkeep_register_writer', 'register_entry', 'UPDATE') as upd",
      ),
    );
    expect(grants.rows[0]).toEqual({ ins: true, upd: false });
    const geomHash = (url: string) =>
      withClient(url, (c) =>
        c
          .query("select md5(string_agg(id::text || encode(st_asewkb(geom), 'hex'), ',' order by id)) as h from parcel")
          .then((r) => r.rows[0].h),
      );
    expect(await geomHash(scratchUrl)).toBe(await geomHash(TEST_DATABASE_URL));
  });

  it('refuses to restore over tables without --clean, and --clean repairs a damaged copy', async () => {
    const refused = db(['restore', file], scratchUrl);
    expect(refused.status).toBe(1);
    expect(refused.stderr).toContain('pass --clean');
    await withClient(scratchUrl, (c) =>
      c.query('drop table register_entry cascade; drop table audit_event cascade; delete from proposal_parcel'),
    );
    const r = db(['restore', file, '--clean'], scratchUrl);
    expect(r.status, r.stderr).toBe(0);
    const restored = await fingerprint(scratchUrl);
    for (const key of ['public.register_entry', 'public.audit_event', 'public.proposal_parcel', 'public.parcel'])
      expect(restored[key], key).toBe(source[key]);
  });

  it('leaves the database as it was when the backup file is damaged', async () => {
    const before = await fingerprint(scratchUrl);
    const broken = path.join(dir, 'broken.dump');
    writeFileSync(broken, readFileSync(file).subarray(0, Math.floor(statSync(file).size * 0.6)));
    const r = db(['restore', broken, '--clean'], scratchUrl);
    expect(r.status).toBe(1);
    expect(r.stderr).toContain('db:');
    expect(await fingerprint(scratchUrl)).toEqual(before);
  });
});
