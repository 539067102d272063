import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('screening_run', (t) => {
    t.comment(
      'One computation of the screening map: what converting each permanent-grassland parcel to full-tillage cropland would get.',
    );
    t.bigIncrements('id');
    t.text('factor_set_id').notNullable();
    t.integer('factor_set_version').notNullable();
    t.text('rule_set_id').notNullable();
    t.integer('rule_set_version').notNullable();
    t.jsonb('layer_versions').notNullable().comment('kind → version of the reference layers used');
    t.bigInteger('map_data_version')
      .notNullable()
      .comment('map_data_version when computed: parcels changed since when it is lower');
    t.integer('parcels_screened').notNullable();
    t.integer('duration_ms').notNullable();
    t.text('reason').notNullable();
    t.text('by').references('id').inTable('user').onDelete('SET NULL');
    t.timestamp('computed_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });
  await knex.schema.createTable('screening_result', (t) => {
    t.comment('The latest screening of one permanent-grassland parcel (replaced by each run).');
    t.bigInteger('parcel_id').primary().references('id').inTable('parcel').onDelete('CASCADE');
    t.bigInteger('run_id').notNullable().references('id').inTable('screening_run').onDelete('CASCADE');
    t.integer('level');
    t.text('label');
    t.double('co2e_total');
    t.double('co2e_high');
    t.double('soc_loss_per_ha');
    t.specificType('rules', 'text[]').notNullable().defaultTo('{}');
    t.text('problem');
    t.index(['level'], 'screening_result_level_idx');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('screening_result');
  await knex.schema.dropTable('screening_run');
}
