import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('region_reference_ratio', (t) => {
    t.comment(
      'The permanent-grassland reference ratio of a region, entered by an admin, with its source; used when the ' +
        'land-use history does not cover the reference date. The newest entry per region counts; earlier ones stay as history.',
    );
    t.bigIncrements('id');
    t.text('region_key').notNullable().comment('class key of the accounting-region (district) layer');
    t.integer('reference_year').notNullable();
    t.double('ratio').notNullable().comment('permanent grassland / agricultural area, 0-1');
    t.text('source').notNullable().comment('where the figure comes from (document, table, date)');
    t.text('entered_by').references('id').inTable('user').onDelete('SET NULL');
    t.timestamp('entered_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['region_key', 'id'], 'region_reference_ratio_key_idx');
    t.check('ratio >= 0 and ratio <= 1', [], 'region_reference_ratio_range_check');
    t.check('reference_year between 1990 and 2100', [], 'region_reference_ratio_year_check');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('region_reference_ratio');
}
