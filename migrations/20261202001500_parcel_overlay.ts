import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('parcel_overlay_run', (t) => {
    t.comment(
      'A parcel was overlaid with a reference layer version; covered_share < 1 means part lies outside every unit.',
    );
    t.bigInteger('parcel_id').notNullable().references('id').inTable('parcel').onDelete('CASCADE');
    t.bigInteger('layer_version_id')
      .notNullable()
      .references('id')
      .inTable('reference_layer_version')
      .onDelete('CASCADE');
    t.double('covered_share').notNullable().comment('share of the parcel inside any feature of the layer, 0-1');
    t.timestamp('computed_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.primary(['parcel_id', 'layer_version_id']);
    t.index(['layer_version_id'], 'parcel_overlay_run_version_idx');
  });

  await knex.schema.createTable('parcel_overlay', (t) => {
    t.comment('Area of a parcel in each class of a reference layer version (ST_Intersection, ST_Area on geography).');
    t.bigInteger('parcel_id').notNullable();
    t.bigInteger('layer_version_id').notNullable();
    t.text('class').notNullable();
    t.double('area_ha').notNullable();
    t.double('share').notNullable().comment('area_ha / parcel area, 0-1');
    t.primary(['parcel_id', 'layer_version_id', 'class']);
    t.foreign(['parcel_id', 'layer_version_id'], 'parcel_overlay_run_fk')
      .references(['parcel_id', 'layer_version_id'])
      .inTable('parcel_overlay_run')
      .onDelete('CASCADE');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('parcel_overlay');
  await knex.schema.dropTable('parcel_overlay_run');
}
