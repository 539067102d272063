import type { Knex } from 'knex';

/**
 * Where an upload's long work stands, so the wizard can be restored after a reload or on another
 * instance: one row per upload (the staging id), kept after the staging row is saved or cancelled,
 * written by the pipeline at each phase change and now and then within a long phase.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('upload_progress', (t) => {
    t.comment(
      'The state of an upload’s long work (read, check, save), readable by any instance; see services/upload-progress.ts.',
    );
    t.uuid('upload_id').primary().comment('the staging id; no foreign key: the row outlives the staged upload');
    t.text('purpose').notNullable().comment('parcels or reference');
    t.text('file_name').notNullable();
    t.text('created_by').notNullable().references('id').inTable('user').onDelete('CASCADE');
    t.text('phase')
      .notNullable()
      .comment('reading, staged, checking, keeping, comparing, validated, storing, overlay, saved, failed, cancelled');
    t.integer('done').comment('features done in this phase, when counted');
    t.integer('total').comment('features this phase works through, when known');
    t.text('message').comment('why it failed, in words for the uploader');
    t.text('failed_in').comment('the phase a failure stopped');
    t.uuid('batch_id').comment('the saved batch');
    t.jsonb('result').comment('what the save did: saved, rejected, reference layer version');
    t.timestamp('started_at', { useTz: true })
      .notNullable()
      .defaultTo(knex.fn.now())
      .comment('when the current step began');
    t.timestamp('phase_at', { useTz: true })
      .notNullable()
      .defaultTo(knex.fn.now())
      .comment('when the current phase began');
    t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['created_by', 'updated_at'], 'upload_progress_owner_idx');
    t.check(
      "phase in ('reading', 'staged', 'checking', 'keeping', 'comparing', 'validated', 'storing', 'overlay', 'saved', 'failed', 'cancelled')",
      [],
      'upload_progress_phase_check',
    );
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('upload_progress');
}
