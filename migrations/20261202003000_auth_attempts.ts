import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('auth_attempt', (t) => {
    t.comment(
      'Failed sign-ins and reset-mail requests, per account and per client address, for throttling with back-off ' +
        '(lib/auth/throttle.ts). Rows older than the window are pruned.',
    );
    t.bigIncrements('id');
    t.text('key').notNullable().comment('"sign-in:account:<e-mail>", "sign-in:address:<ip>", "reset:account:<e-mail>"');
    t.timestamp('at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['key', 'at'], 'auth_attempt_key_at_idx');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('auth_attempt');
}
