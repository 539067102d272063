/**
 * `npm run db backup [FILE]` and `npm run db restore FILE [--clean]`: the app's database (DATABASE_URL,
 * else the local cluster's `swardkeep`) to and from a pg_dump custom-format file, schema, data,
 * PostGIS and the job queue's `pgboss` schema included.
 *
 * - backup writes FILE (default `.data/backups/<database>-<UTC time>.dump`), one consistent snapshot
 *   taken while the app keeps running.
 * - restore loads FILE in one transaction (all or nothing: pg_restore writes it out as SQL to a
 *   temporary file, psql runs that with --single-transaction). Into an empty (or missing) database as it is; into one that holds tables
 *   only with --clean, which in the same transaction first drops the `public` and `pgboss` schemas
 *   (so the database then holds exactly the backup; pg_restore's own --clean cannot drop pg-boss's
 *   partitioned tables). Ownership is not restored (the restoring user owns everything); grants are,
 *   so the register stays insert-only for `swardkeep_register_writer`, which is created first when the
 *   server lacks it (roles belong to the server, not to a backup). Other roles a grant names must exist.
 * The password is handed over in PGPASSWORD, never on the command line.
 */
import { spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, rmSync, statSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import pg from 'pg';
import { databaseUrl } from '../knexfile';

type Bin = (name: string) => string;

function fail(message: string): never {
  console.error(`db: ${message}`);
  process.exit(1);
}

/** The URL (`full` for our own client), the same without its password for the tools, and the password for PGPASSWORD. */
function target(): { full: string; url: string; name: string; password: string } {
  const full = process.env.DATABASE_URL ?? databaseUrl();
  const u = new URL(full);
  const password = decodeURIComponent(u.password);
  u.password = '';
  return { full, url: u.toString(), name: decodeURIComponent(u.pathname.slice(1)), password };
}

function run(bin: string, args: string[], password: string): void {
  const r = spawnSync(bin, args, {
    encoding: 'utf8',
    env: { ...process.env, PGPASSWORD: password },
    stdio: ['ignore', 'inherit', 'pipe'],
  });
  if (r.status !== 0)
    fail(`${path.basename(bin)} failed:\n${(r.stderr ?? '').trim().split('\n').slice(-15).join('\n')}`);
}

export function backup(args: string[], pgBin: Bin): void {
  const { url, name, password } = target();
  const stamp = new Date().toISOString().replace(/[-:]/g, '').replace(/\..*/, 'Z');
  const file = path.resolve(args[0] ?? path.join('.data', 'backups', `${name}-${stamp}.dump`));
  mkdirSync(path.dirname(file), { recursive: true });
  run(pgBin('pg_dump'), ['--format=custom', '--no-owner', '--file', file, '--dbname', url], password);
  console.log(`db: backup of ${name} written to ${file} (${(statSync(file).size / 1e6).toFixed(1)} MB)`);
}

async function prepareTarget(full: string, name: string, clean: boolean): Promise<void> {
  const client = new pg.Client({ connectionString: full });
  try {
    await client.connect();
  } catch (err) {
    if ((err as { code?: string }).code !== '3D000') fail(`cannot reach ${name}: ${(err as Error).message}`);
    // The database does not exist: create it (needs the CREATEDB right).
    const admin = new URL(full);
    admin.pathname = '/postgres';
    const c = new pg.Client({ connectionString: admin.toString() });
    await c.connect();
    if (!/^[A-Za-z_][A-Za-z0-9_]*$/.test(name)) fail(`will not create a database named ${name}`);
    await c.query(`create database ${name}`).finally(() => c.end());
    console.log(`db: created database ${name}`);
    return;
  }
  try {
    const r = await client.query(
      "select count(*)::int as n from information_schema.tables where table_schema in ('public', 'pgboss') and " +
        "table_type = 'BASE TABLE' and table_name <> 'spatial_ref_sys'",
    );
    if (r.rows[0].n > 0 && !clean)
      fail(
        `${name} already holds ${r.rows[0].n} tables. Restore into an empty database, or pass --clean to replace what the backup holds (stop the app first).`,
      );
  } finally {
    await client.end();
  }
}

/**
 * pg_restore writes the whole backup as SQL first (a damaged file fails here, before anything is
 * touched), then psql runs `preamble` and that SQL in one transaction.
 */
function restoreInOneTransaction(pgBin: Bin, file: string, url: string, password: string, preamble: string[]): void {
  const tmp = mkdtempSync(path.join(os.tmpdir(), 'swardkeep-restore-'));
  try {
    const sql = path.join(tmp, 'restore.sql');
    run(pgBin('pg_restore'), ['--no-owner', '--file', sql, file], password);
    const psqlArgs = [
      '-X',
      '-q',
      '-v',
      'ON_ERROR_STOP=1',
      '--single-transaction',
      ...preamble.flatMap((c) => ['-c', c]),
      '-f',
      sql,
      '--dbname',
      url,
    ];
    const r = spawnSync(pgBin('psql'), psqlArgs, {
      encoding: 'utf8',
      env: { ...process.env, PGPASSWORD: password },
      stdio: ['ignore', 'ignore', 'pipe'],
    });
    if (r.status !== 0)
      fail(`restore failed, nothing was changed:\n${(r.stderr ?? '').trim().split('\n').slice(-15).join('\n')}`);
  } finally {
    rmSync(tmp, { recursive: true, force: true });
  }
}

export async function restore(args: string[], pgBin: Bin): Promise<void> {
  const clean = args.includes('--clean');
  const file = args.find((a) => !a.startsWith('--'));
  if (!file) fail('usage: db restore FILE [--clean]');
  if (!existsSync(file)) fail(`no such file: ${file}`);
  const { full, url, name, password } = target();
  await prepareTarget(full, name, clean);
  const role =
    "do $$ begin if not exists (select 1 from pg_roles where rolname = 'swardkeep_register_writer') then create " +
    'role swardkeep_register_writer nologin; end if; end $$';
  const preamble = [
    role,
    ...(clean
      ? ['drop schema if exists pgboss cascade', 'drop schema if exists public cascade', 'create schema public']
      : []),
  ];
  restoreInOneTransaction(pgBin, path.resolve(file), url, password, preamble);
  console.log(`db: ${file} restored into ${name}`);
}
