import type { Knex } from 'knex';

/**
 * A row version on users, so an administrator's change of roles or status names the version it
 * read and a change made meanwhile by someone else answers 409 instead of being overwritten.
 * better-auth never writes this column; the default covers its inserts.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('user', (t) => {
    t.integer('version')
      .notNullable()
      .defaultTo(1)
      .comment(
        'Bumped by every administrator change (roles, name, active); writers send the version they read, else 409',
      );
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('user', (t) => t.dropColumn('version'));
}
