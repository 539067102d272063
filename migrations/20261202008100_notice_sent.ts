import type { Knex } from 'knex';

/** Reminders and overdue notices already sent: the timed jobs insert here first, so each goes out once whichever instance runs the job. */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('notice_sent', (t) => {
    t.comment(
      'One row per reminder or overdue notice sent (proposal deadlines, follow-up tasks); the primary key makes a second send impossible.',
    );
    t.text('subject_type').notNullable().comment('proposal | follow_up_task');
    t.bigInteger('subject_id').notNullable();
    t.text('notice')
      .notNullable()
      .comment('e.g. deadline-reminder:2027-01-31, deadline-overdue:2027-01-31, follow-up-overdue');
    t.integer('recipients').notNullable().defaultTo(0);
    t.timestamp('sent_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.primary(['subject_type', 'subject_id', 'notice']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('notice_sent');
}
