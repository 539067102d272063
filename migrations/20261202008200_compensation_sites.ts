import type { Knex } from 'knex';

/** Parcels restored to grassland as compensation for an approval, with the credited gain and how long it must stay in grass. */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('compensation_site', (t) => {
    t.comment(
      'A parcel restored to grassland as compensation for an approved conversion; its credited CO2e gain holds ' +
        'only while it stays in grass until permanence_until.',
    );
    t.bigIncrements('id');
    t.bigInteger('parcel_id').notNullable().references('id').inTable('parcel').onDelete('RESTRICT');
    t.bigInteger('proposal_id').notNullable().references('id').inTable('proposal').onDelete('RESTRICT');
    t.bigInteger('decision_id').notNullable().references('id').inTable('board_decision').onDelete('RESTRICT');
    t.bigInteger('register_seq')
      .notNullable()
      .references('seq')
      .inTable('register_entry')
      .onDelete('RESTRICT')
      .comment('The decision entry that credited the gain');
    t.double('credited_co2e_t')
      .notNullable()
      .comment('CO2e removal credited over the transition period, t CO2e, positive');
    t.double('credited_soc_t').notNullable().comment('Soil-carbon gain credited, t C, positive');
    t.date('effective_date').notNullable();
    t.date('permanence_until').notNullable().comment('effective_date + the compensation.permanence-years setting');
    t.text('status').notNullable().defaultTo('held').comment('held | reversed');
    t.bigInteger('reversed_seq')
      .references('seq')
      .inTable('register_entry')
      .onDelete('RESTRICT')
      .comment('The register entry that reversed the gain');
    t.bigInteger('reversed_event_id').references('id').inTable('land_use_event').onDelete('SET NULL');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.check("status in ('held', 'reversed')", [], 'compensation_site_status_check');
    t.check('credited_co2e_t >= 0', [], 'compensation_site_gain_check');
    t.check('permanence_until >= effective_date', [], 'compensation_site_period_check');
    t.index(['parcel_id', 'status'], 'compensation_site_parcel_idx');
    t.unique(['decision_id', 'parcel_id'], { indexName: 'compensation_site_decision_unique' });
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('compensation_site');
}
