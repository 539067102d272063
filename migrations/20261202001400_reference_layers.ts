import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('reference_layer_version', (t) => {
    t.comment(
      'A version of a reference layer (climate, soil, sensitive, slope, never-tilled). Published versions stay for old assessments.',
    );
    t.bigIncrements('id');
    t.text('kind').notNullable();
    t.integer('version').notNullable();
    t.text('status').notNullable().comment('draft or published; the newest published version of a kind is current');
    t.text('class_attribute').notNullable().comment('source column that held the class');
    t.text('label_attribute').comment('source column that held a feature name, if any');
    t.specificType('classes', 'text[]').notNullable();
    t.integer('feature_count').notNullable();
    t.uuid('batch_id').references('id').inTable('upload_batch').onDelete('SET NULL');
    t.text('created_by').references('id').inTable('user').onDelete('SET NULL');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.text('published_by').references('id').inTable('user').onDelete('SET NULL');
    t.timestamp('published_at', { useTz: true });
    t.text('note');
    t.unique(['kind', 'version'], { indexName: 'reference_layer_version_unique' });
    t.check(
      "kind in ('climate', 'soil', 'sensitive', 'slope', 'never-tilled')",
      [],
      'reference_layer_version_kind_check',
    );
    t.check("status in ('draft', 'published')", [], 'reference_layer_version_status_check');
  });

  await knex.schema.createTable('reference_feature', (t) => {
    t.comment('A polygon of a reference layer version with its class.');
    t.bigIncrements('id');
    t.bigInteger('version_id').notNullable().references('id').inTable('reference_layer_version').onDelete('CASCADE');
    t.text('class').notNullable();
    t.text('label');
    t.specificType('geom', 'geometry(MultiPolygon, 4326)').notNullable();
    t.index(['version_id'], 'reference_feature_version_idx');
  });
  await knex.raw(
    'alter table reference_feature add column geom_3857 geometry(MultiPolygon, 3857) generated always as (st_transform(geom, 3857)) stored',
  );
  await knex.raw('create index reference_feature_geom_gist on reference_feature using gist (geom)');
  await knex.raw('create index reference_feature_geom_3857_gist on reference_feature using gist (geom_3857)');
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('reference_feature');
  await knex.schema.dropTable('reference_layer_version');
}
