/**
 * Whether the database's schema is the one this build expects: the migration files shipped in the
 * checkout (`migrations/`, beside the running build) against the rows in `knex_migrations`.
 */
import { readdir } from 'node:fs/promises';
import path from 'node:path';
import type { Db } from './client';

export type MigrationState = { applied: number; pending: string[]; unknown: string[]; locked: boolean };

export function migrationsFolder(): string {
  return path.resolve(process.env.SWARDKEEP_ROOT ?? process.cwd(), 'migrations');
}

/** Throws when the folder cannot be read; a database without the knex tables has everything pending. */
export async function migrationState(db: Db, folder = migrationsFolder()): Promise<MigrationState> {
  const files = (await readdir(folder)).filter((f) => f.endsWith('.ts') && !f.endsWith('.d.ts')).sort();
  const exists = await db.raw<{ rows: { t: string | null; l: string | null }[] }>(
    "select to_regclass('knex_migrations')::text as t, to_regclass('knex_migrations_lock')::text as l",
  );
  const { t, l } = exists.rows[0] ?? { t: null, l: null };
  const done = t
    ? new Set((await db('knex_migrations').select<{ name: string }[]>('name')).map((r) => r.name))
    : new Set<string>();
  const locked = l
    ? Boolean((await db('knex_migrations_lock').max<{ m: number | null }>('is_locked as m').first())?.m)
    : false;
  return {
    applied: done.size,
    pending: files.filter((f) => !done.has(f)),
    unknown: [...done].filter((n) => !files.includes(n)),
    locked,
  };
}
