import type { Knex } from 'knex';

/**
 * Reversed compensations count in the committed CO2e of the year their parcel was ploughed
 * (`committedCo2e`); a partial index holds just those entries, so the sum never reads the whole register.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.raw(`create index register_entry_reversal_idx on register_entry (((content->'reverses'->>'budgetYear')::int))
    where content->>'kind' = 'compensation-reversed'`);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('drop index register_entry_reversal_idx');
}
