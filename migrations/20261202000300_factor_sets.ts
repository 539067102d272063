import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('factor_set', (t) => {
    t.comment('A named set of IPCC Tier 1 (or country-specific Tier 2) factors. Values live in its versions.');
    t.text('id').primary().comment('kebab-case, e.g. ipcc-2006');
    t.text('title').notNullable();
    t.text('description').notNullable();
    t.text('origin').notNullable().comment('shipped (read-only, from src/lib/carbon/factor-sets) or custom');
    t.text('based_on_id');
    t.integer('based_on_version');
    t.text('created_by').references('id').inTable('user').onDelete('SET NULL');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.check("origin in ('shipped', 'custom')", [], 'factor_set_origin_check');
  });

  await knex.schema.createTable('factor_set_version', (t) => {
    t.comment('One version of a factor set. Published versions are immutable; an estimate names the version it used.');
    t.text('set_id').notNullable().references('id').inTable('factor_set').onDelete('CASCADE');
    t.integer('version').notNullable();
    t.text('status').notNullable().comment('draft (editable by admins) or published (immutable)');
    t.jsonb('document').notNullable().comment('FactorSetDocument, validated by factorSetDocumentSchema');
    t.text('publish_note');
    t.text('published_by').references('id').inTable('user').onDelete('SET NULL');
    t.timestamp('published_at', { useTz: true });
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.primary(['set_id', 'version']);
    t.check("status in ('draft', 'published')", [], 'factor_set_version_status_check');
  });
  await knex.raw("create unique index factor_set_one_draft on factor_set_version (set_id) where status = 'draft'");

  await knex.schema.createTable('factor_table_confirmation', (t) => {
    t.comment('An admin has read a whole table of a published version against the published document.');
    t.bigIncrements('id');
    t.text('set_id').notNullable();
    t.integer('version').notNullable();
    t.text('table_key').notNullable();
    t.text('confirmed_by').references('id').inTable('user').onDelete('SET NULL');
    t.timestamp('confirmed_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.text('document').notNullable();
    t.text('page').notNullable();
    t.foreign(['set_id', 'version'], 'factor_table_confirmation_version_fk')
      .references(['set_id', 'version'])
      .inTable('factor_set_version')
      .onDelete('CASCADE');
    t.unique(['set_id', 'version', 'table_key'], { indexName: 'factor_table_confirmation_unique' });
  });

  await knex.schema.createTable('factor_edit', (t) => {
    t.comment('Every change of a value in a draft, with its required reason: the provenance of Tier 2 values.');
    t.bigIncrements('id');
    t.text('set_id').notNullable();
    t.integer('version').notNullable();
    t.text('table_key').notNullable();
    t.text('entry_key').notNullable();
    t.jsonb('before').notNullable();
    t.jsonb('after').notNullable();
    t.text('reason').notNullable();
    t.text('edited_by').references('id').inTable('user').onDelete('SET NULL');
    t.timestamp('edited_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.foreign(['set_id', 'version'], 'factor_edit_version_fk')
      .references(['set_id', 'version'])
      .inTable('factor_set_version')
      .onDelete('CASCADE');
  });

  await knex.schema.createTable('app_setting', (t) => {
    t.comment('Settings of the authority: default factor set, thresholds, look-back windows.');
    t.text('key').primary();
    t.jsonb('value').notNullable();
    t.text('updated_by').references('id').inTable('user').onDelete('SET NULL');
    t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('app_setting');
  await knex.schema.dropTable('factor_edit');
  await knex.schema.dropTable('factor_table_confirmation');
  await knex.schema.dropTable('factor_set_version');
  await knex.schema.dropTable('factor_set');
}
