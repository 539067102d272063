import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('upload_staging', (t) => {
    t.comment(
      'An upload between parse and save: kept in the database (any instance can continue it) until saved, cancelled or expired.',
    );
    t.uuid('id').primary();
    t.text('purpose').notNullable().comment('parcels or reference');
    t.text('file_name').notNullable();
    t.text('format').notNullable();
    t.integer('size_bytes').notNullable();
    t.text('sha256').notNullable();
    t.binary('file_bytes').notNullable();
    t.jsonb('layers').notNullable().comment('what the parse found: layer names, columns with samples, detected CRS');
    t.text('layer_name').comment('layer chosen at validation');
    t.jsonb('source_crs').comment('CRS chosen at validation');
    t.jsonb('column_mapping').comment('mapping chosen at validation');
    t.jsonb('report_summary').comment('counts of the last validation');
    t.timestamp('validated_at', { useTz: true });
    t.text('created_by').notNullable().references('id').inTable('user').onDelete('CASCADE');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('expires_at', { useTz: true }).notNullable();
    t.index(['expires_at'], 'upload_staging_expires_idx');
  });

  await knex.schema.createTable('upload_staging_feature', (t) => {
    t.comment('One validated feature of a staged upload: its status, issues, mapped values and normalised geometry.');
    t.uuid('staging_id').notNullable().references('id').inTable('upload_staging').onDelete('CASCADE');
    t.integer('idx').notNullable().comment('0-based position in the source layer');
    t.text('status').notNullable().comment('ok, repaired or rejected');
    t.text('reference');
    t.jsonb('issues').notNullable().defaultTo('[]');
    t.jsonb('fields')
      .notNullable()
      .defaultTo('{}')
      .comment('mapped values: land use, management, dates, owner, stated area, class');
    t.specificType('geom', 'geometry(MultiPolygon, 4326)').comment('normalised geometry; null when rejected');
    t.specificType('raw_geom', 'geometry(Geometry, 4326)').comment(
      'reprojected source geometry of a self-intersecting feature, for ST_MakeValid',
    );
    t.primary(['staging_id', 'idx']);
    t.check("status in ('ok', 'repaired', 'rejected')", [], 'upload_staging_feature_status_check');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('upload_staging_feature');
  await knex.schema.dropTable('upload_staging');
}
