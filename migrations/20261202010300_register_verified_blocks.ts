import type { Knex } from 'knex';

/**
 * Blocks of register entries whose chain `GET /api/register/verify` has recomputed in full, with a
 * SHA-256 of the block's rows as the database held them then. A later verify recomputes that digest
 * in SQL and hashes again in full only the blocks whose rows no longer give it (and what follows).
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('register_verified_block', (t) => {
    t.comment(
      'Blocks of the register chain verified in full, each with a SHA-256 of its stored rows (seq, prev_hash, hash,' +
        ' content as text) at that time. Trusted only while the rows still give the same digest.',
    );
    t.bigInteger('first_seq').notNullable();
    t.bigInteger('last_seq').notNullable();
    t.text('last_hash').notNullable().comment('hash of entry last_seq: where the chain continues');
    t.text('digest')
      .notNullable()
      .comment('SHA-256 hex of the rows, one line per entry: seq, prev_hash, hash, content::text');
    t.timestamp('verified_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.primary(['first_seq', 'last_seq'], { constraintName: 'register_verified_block_pkey' });
    t.check('last_seq >= first_seq', [], 'register_verified_block_range_check');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('register_verified_block');
}
