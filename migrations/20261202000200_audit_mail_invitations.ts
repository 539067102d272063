import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.raw('create extension if not exists postgis');

  await knex.schema.createTable('audit_event', (t) => {
    t.comment('Who did what to which record, and when. Append-only.');
    t.bigIncrements('id');
    t.timestamp('at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.text('actor_id').references('id').inTable('user').onDelete('SET NULL').comment('null for the system');
    t.text('action').notNullable().comment('verb.noun, e.g. user.invite');
    t.text('entity_type').notNullable();
    t.text('entity_id').notNullable();
    t.jsonb('details').notNullable().defaultTo('{}');
    t.index(['entity_type', 'entity_id'], 'audit_event_entity_idx');
  });

  await knex.schema.createTable('mail_outbox', (t) => {
    t.comment('Transactional outbox: mail written with the change that causes it, delivered by the worker.');
    t.bigIncrements('id');
    t.text('recipient').notNullable();
    t.text('subject').notNullable();
    t.text('body_text').notNullable();
    t.text('body_html').notNullable();
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('next_attempt_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.integer('attempts').notNullable().defaultTo(0);
    t.text('last_error');
    t.timestamp('sent_at', { useTz: true });
  });
  await knex.raw('create index mail_outbox_due_idx on mail_outbox (next_attempt_at) where sent_at is null');

  await knex.schema.createTable('mail_capture', (t) => {
    t.comment('Mail received by the local SMTP fake (development and tests only); admins read it in the app.');
    t.bigIncrements('id');
    t.timestamp('received_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.text('mail_from').notNullable();
    t.specificType('rcpt_to', 'text[]').notNullable();
    t.text('subject').notNullable().defaultTo('');
    t.text('body_text').notNullable().defaultTo('');
    t.text('body_html');
  });

  await knex.schema.createTable('invitation', (t) => {
    t.comment('Admin invitations. The token is stored only as a SHA-256 hash.');
    t.text('id').primary();
    t.text('user_id').notNullable().references('id').inTable('user').onDelete('CASCADE');
    t.text('token_hash').notNullable().unique('invitation_token_hash_unique');
    t.text('invited_by').references('id').inTable('user').onDelete('SET NULL');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('expires_at', { useTz: true }).notNullable();
    t.timestamp('accepted_at', { useTz: true });
    t.timestamp('revoked_at', { useTz: true });
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('invitation');
  await knex.schema.dropTable('mail_capture');
  await knex.schema.dropTable('mail_outbox');
  await knex.schema.dropTable('audit_event');
}
