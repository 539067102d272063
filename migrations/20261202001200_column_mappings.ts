import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('column_mapping', (t) => {
    t.comment('The last column mapping used for a source, offered again when a file with the same columns arrives.');
    t.text('source_key').primary().comment('purpose + sorted column names, e.g. parcels:field_ref,land_use,…');
    t.text('purpose').notNullable();
    t.jsonb('mapping').notNullable();
    t.text('updated_by').references('id').inTable('user').onDelete('SET NULL');
    t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('column_mapping');
}
