import type { Knex } from 'knex';

/**
 * An assessment of thousands of parcels stores several megabytes of JSON in `result`; PostgreSQL's
 * default TOAST compression (pglz) takes a large share of the save. LZ4 compresses it several times
 * faster for a similar size. Only new values are written with it; a server built without LZ4 keeps pglz.
 */
async function hasLz4(knex: Knex): Promise<boolean> {
  const r = await knex.raw(
    `select 'lz4' = any(enumvals) as ok from pg_settings where name = 'default_toast_compression'`,
  );
  return r.rows[0]?.ok === true;
}

export async function up(knex: Knex): Promise<void> {
  if (await hasLz4(knex))
    await knex.raw(
      'alter table assessment alter column result set compression lz4, alter column inputs set compression lz4',
    );
}

export async function down(knex: Knex): Promise<void> {
  if (await hasLz4(knex))
    await knex.raw(
      'alter table assessment alter column result set compression pglz, alter column inputs set compression pglz',
    );
}
