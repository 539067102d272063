import type { Knex } from 'knex';

/**
 * `assessment.result` and `inputs` as `json` instead of `jsonb`: nothing reads inside them in SQL,
 * and a 2,000-parcel result is about 2 MB of text, which PostgreSQL checks as JSON and keeps as written
 * (LZ4-compressed, see 20261203020100) instead of building and compressing its binary form on every save
 * and turning it back into text on every read. The app reads either type the same way (node-postgres parses both).
 */
async function hasLz4(knex: Knex): Promise<boolean> {
  const r = await knex.raw(
    `select 'lz4' = any(enumvals) as ok from pg_settings where name = 'default_toast_compression'`,
  );
  return r.rows[0]?.ok === true;
}

async function retype(knex: Knex, type: 'json' | 'jsonb'): Promise<void> {
  await knex.raw(
    `alter table assessment alter column result type ${type} using result::${type}, ` +
      `alter column inputs type ${type} using inputs::${type}`,
  );
  if (await hasLz4(knex))
    await knex.raw(
      'alter table assessment alter column result set compression lz4, alter column inputs set compression lz4',
    );
}

export async function up(knex: Knex): Promise<void> {
  await retype(knex, 'json');
}

export async function down(knex: Knex): Promise<void> {
  await retype(knex, 'jsonb');
}
