import type { Knex } from 'knex';

/** Board meetings, their items (signed-off assessments' proposals), declared conflicts, votes and decisions. */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('meeting', (t) => {
    t.comment('A board meeting: date, place, and the items on its agenda.');
    t.bigIncrements('id');
    t.date('meeting_date').notNullable();
    t.text('place').notNullable();
    t.integer('version').notNullable().defaultTo(1).comment('Row version for optimistic locking');
    t.text('created_by').references('id').inTable('user').onDelete('SET NULL');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['meeting_date'], 'meeting_date_idx');
  });

  await knex.schema.createTable('meeting_item', (t) => {
    t.comment('A proposal on a meeting agenda, with the signed assessment the board reads.');
    t.bigIncrements('id');
    t.bigInteger('meeting_id').notNullable().references('id').inTable('meeting').onDelete('RESTRICT');
    t.bigInteger('proposal_id').notNullable().references('id').inTable('proposal').onDelete('RESTRICT');
    t.bigInteger('assessment_id').notNullable().references('id').inTable('assessment').onDelete('RESTRICT');
    t.integer('position').notNullable();
    t.text('status').notNullable().defaultTo('listed');
    t.bigInteger('carried_from')
      .references('id')
      .inTable('meeting_item')
      .onDelete('SET NULL')
      .comment('The deferred item this one continues');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.check("status in ('listed', 'decided', 'deferred', 'withdrawn')", [], 'meeting_item_status_check');
    t.unique(['meeting_id', 'proposal_id'], { indexName: 'meeting_item_proposal_unique' });
    t.index(['proposal_id'], 'meeting_item_proposal_idx');
  });
  await knex.raw("create unique index meeting_item_one_open on meeting_item (proposal_id) where status = 'listed'");

  await knex.schema.createTable('meeting_conflict', (t) => {
    t.comment('A conflict of interest a member declared on an item: that member cannot vote on it.');
    t.bigInteger('item_id').notNullable().references('id').inTable('meeting_item').onDelete('CASCADE');
    t.text('user_id').notNullable().references('id').inTable('user').onDelete('RESTRICT');
    t.text('reason').notNullable().comment('PRIVATE to the board');
    t.timestamp('declared_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.primary(['item_id', 'user_id']);
  });

  await knex.schema.createTable('meeting_vote', (t) => {
    t.comment('A vote of a member on an item (PRIVATE: who voted how never reaches the public register).');
    t.bigInteger('item_id').notNullable().references('id').inTable('meeting_item').onDelete('CASCADE');
    t.text('user_id').notNullable().references('id').inTable('user').onDelete('RESTRICT');
    t.text('choice').notNullable();
    t.text('comment');
    t.timestamp('voted_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.primary(['item_id', 'user_id']);
    t.check(
      "choice in ('approve', 'approve-with-conditions', 'refuse', 'defer', 'abstain')",
      [],
      'meeting_vote_choice_check',
    );
  });

  await knex.schema.createTable('board_decision', (t) => {
    t.comment(
      'What the board decided on an item (a deferral too); at most one per item. Approvals and refusals are written to the register.',
    );
    t.bigIncrements('id');
    t.bigInteger('item_id').notNullable().references('id').inTable('meeting_item').onDelete('RESTRICT');
    t.bigInteger('proposal_id').notNullable().references('id').inTable('proposal').onDelete('RESTRICT');
    t.text('outcome').notNullable();
    t.text('reasons').notNullable();
    t.jsonb('conditions').notNullable().defaultTo('[]').comment('[{ text, dueDate, checkedBy }]');
    t.integer('appeal_days');
    t.date('effective_date');
    t.bigInteger('register_seq').references('seq').inTable('register_entry').onDelete('RESTRICT');
    t.text('decided_by').references('id').inTable('user').onDelete('SET NULL');
    t.timestamp('decided_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.unique(['item_id'], { indexName: 'board_decision_item_unique' });
    t.index(['proposal_id'], 'board_decision_proposal_idx');
    t.check(
      "outcome in ('approved', 'approved-with-conditions', 'refused', 'deferred')",
      [],
      'board_decision_outcome_check',
    );
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('board_decision');
  await knex.schema.dropTable('meeting_vote');
  await knex.schema.dropTable('meeting_conflict');
  await knex.schema.dropTable('meeting_item');
  await knex.schema.dropTable('meeting');
}
