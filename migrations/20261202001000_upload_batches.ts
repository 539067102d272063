import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('upload_batch', (t) => {
    t.comment(
      'A saved upload (parcels or a reference layer): the original file, its SHA-256 and who brought it, for provenance.',
    );
    t.uuid('id').primary();
    t.text('purpose').notNullable().comment('parcels or reference');
    t.text('file_name').notNullable();
    t.text('format').notNullable().comment('shapefile-zip or geojson');
    t.integer('size_bytes').notNullable();
    t.text('sha256').notNullable().comment('hex SHA-256 of file_bytes');
    t.binary('file_bytes').notNullable().comment('the original upload, byte for byte');
    t.text('layer_name').notNullable().comment('layer of the file that was imported');
    t.jsonb('source_crs').notNullable().comment('{ epsg, name, definition, source: prj | picked | geojson }');
    t.jsonb('column_mapping').notNullable().comment('which source column fed which Swardkeep field');
    t.integer('feature_count').notNullable();
    t.integer('saved_count').notNullable();
    t.text('uploaded_by').references('id').inTable('user').onDelete('SET NULL');
    t.timestamp('uploaded_at', { useTz: true }).notNullable().comment('when the file reached the server');
    t.timestamp('saved_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.check("purpose in ('parcels', 'reference')", [], 'upload_batch_purpose_check');
    t.check("format in ('shapefile-zip', 'geojson')", [], 'upload_batch_format_check');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('upload_batch');
}
