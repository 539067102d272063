import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('parcel', (t) => {
    t.comment('A land parcel in the register. area_ha (ellipsoidal, ST_Area on geography) is the figure of record.');
    t.bigIncrements('id');
    t.text('reference').notNullable().unique({ indexName: 'parcel_reference_unique' });
    t.text('name');
    t.text('land_use').comment('current land use, from the newest land-use event');
    t.text('management').comment('current management, from the newest management event');
    t.text('owner_ref').comment('PRIVATE: holding or owner reference; never on public pages or exports');
    t.double('stated_area_ha').comment('area stated in the source, converted to ha');
    t.double('area_ha').notNullable().comment('ST_Area(geom::geography) / 10 000');
    t.specificType('geom', 'geometry(MultiPolygon, 4326)').notNullable();
    t.uuid('batch_id')
      .references('id')
      .inTable('upload_batch')
      .onDelete('SET NULL')
      .comment('null when drawn on the map');
    t.integer('version').notNullable().defaultTo(1).comment('row version, +1 on every boundary or state change');
    t.text('created_by').references('id').inTable('user').onDelete('SET NULL');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.text('updated_by').references('id').inTable('user').onDelete('SET NULL');
    t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });
  // Web Mercator copy for vector tiles, kept by PostgreSQL itself (ST_Transform is immutable).
  await knex.raw(
    'alter table parcel add column geom_3857 geometry(MultiPolygon, 3857) generated always as (st_transform(geom, 3857)) stored',
  );
  await knex.raw('create index parcel_geom_gist on parcel using gist (geom)');
  await knex.raw('create index parcel_geom_3857_gist on parcel using gist (geom_3857)');
  await knex.raw('create index parcel_batch_idx on parcel (batch_id)');

  await knex.schema.createTable('land_use_event', (t) => {
    t.comment(
      'Dated land-use history of a parcel: use, management, tillage, reseeding; with who recorded it and the evidence.',
    );
    t.bigIncrements('id');
    t.bigInteger('parcel_id').notNullable().references('id').inTable('parcel').onDelete('CASCADE');
    t.date('event_date').notNullable();
    t.text('kind').notNullable();
    t.text('value').comment('the use (grassland, arable …) or a description of the work');
    t.boolean('cultivation')
      .notNullable()
      .defaultTo(false)
      .comment('management that counts as cultivation (lime, fertiliser)');
    t.text('evidence').notNullable().comment('where the fact comes from: upload file, survey, declaration …');
    t.text('recorded_by').references('id').inTable('user').onDelete('SET NULL');
    t.timestamp('recorded_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.uuid('batch_id').references('id').inTable('upload_batch').onDelete('SET NULL');
    t.index(['parcel_id', 'event_date'], 'land_use_event_parcel_idx');
    t.check("kind in ('land-use', 'management', 'tillage', 'reseeding')", [], 'land_use_event_kind_check');
  });

  await knex.schema.createTable('map_data_version', (t) => {
    t.comment(
      'Version counters of what the map shows; vector-tile ETags are built from them so every instance agrees.',
    );
    t.text('name').primary();
    t.bigInteger('version').notNullable();
    t.timestamp('changed_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });
  await knex('map_data_version').insert({ name: 'map', version: 1 });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('map_data_version');
  await knex.schema.dropTable('land_use_event');
  await knex.schema.dropTable('parcel');
}
