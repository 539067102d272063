import type { Knex } from 'knex';

/**
 * The audit page filters by action, by actor and by time and pages newest first (`searchAuditEvents`);
 * each filter has an index ending in `id`, so a page reads only its own rows.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.raw('create index audit_event_action_idx on audit_event (action, id)');
  await knex.raw('create index audit_event_actor_idx on audit_event (actor_id, id)');
  await knex.raw('create index audit_event_at_idx on audit_event (at, id)');
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('drop index audit_event_at_idx');
  await knex.raw('drop index audit_event_actor_idx');
  await knex.raw('drop index audit_event_action_idx');
}
