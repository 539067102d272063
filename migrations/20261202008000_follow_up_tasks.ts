import type { Knex } from 'knex';

/**
 * Follow-up tasks of board decisions: one per condition, one per approved conversion (a site check),
 * one per compensation parcel, one per reversed compensation; with their outcome and evidence files.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('follow_up_task', (t) => {
    t.comment(
      'Work a board decision leaves behind: check a condition, confirm a conversion on site, confirm or review a compensation parcel.',
    );
    t.bigIncrements('id');
    t.bigInteger('proposal_id').notNullable().references('id').inTable('proposal').onDelete('RESTRICT');
    t.bigInteger('decision_id')
      .references('id')
      .inTable('board_decision')
      .onDelete('RESTRICT')
      .comment('The decision that created the task');
    t.text('kind').notNullable().comment('condition | site-check | compensation-check | compensation-reversed');
    t.integer('condition_index').comment('Position of the condition in the decision (0-based), for kind = condition');
    t.text('title').notNullable();
    t.date('due_date').notNullable();
    t.text('checked_by')
      .notNullable()
      .comment('The office that checks, as the decision names it (e.g. "Field officer")');
    t.text('assignee_role').notNullable().comment('Role that is mailed and expected to record the outcome');
    t.text('status').notNullable().defaultTo('open').comment('open | done | not-done | partly');
    t.text('outcome_note');
    t.text('outcome_by').references('id').inTable('user').onDelete('SET NULL');
    t.timestamp('outcome_at', { useTz: true });
    t.integer('version').notNullable().defaultTo(1).comment('Row version for optimistic locking');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.check(
      "kind in ('condition', 'site-check', 'compensation-check', 'compensation-reversed')",
      [],
      'follow_up_task_kind_check',
    );
    t.check("status in ('open', 'done', 'not-done', 'partly')", [], 'follow_up_task_status_check');
    t.check("assignee_role in ('assessor', 'chair')", [], 'follow_up_task_role_check');
    t.index(['status', 'due_date'], 'follow_up_task_status_due_idx');
    t.index(['proposal_id'], 'follow_up_task_proposal_idx');
  });

  await knex.schema.createTable('follow_up_evidence', (t) => {
    t.comment('Files that show a follow-up outcome (PDF, PNG, JPEG; type checked by content).');
    t.uuid('id').primary();
    t.bigInteger('task_id').notNullable().references('id').inTable('follow_up_task').onDelete('RESTRICT');
    t.text('file_name').notNullable();
    t.text('media_type').notNullable();
    t.integer('size_bytes').notNullable();
    t.text('sha256').notNullable();
    t.binary('bytes').notNullable();
    t.text('uploaded_by').references('id').inTable('user').onDelete('SET NULL');
    t.timestamp('uploaded_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.check("media_type in ('application/pdf', 'image/png', 'image/jpeg')", [], 'follow_up_evidence_type_check');
    t.index(['task_id'], 'follow_up_evidence_task_idx');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('follow_up_evidence');
  await knex.schema.dropTable('follow_up_task');
}
