import type { Knex } from 'knex';

/**
 * Sort orders of the public register list served from an index at 100,000 entries: the decision
 * date and the CO2e total (expressions of the content, as the list sorts by them), and the
 * reference with seq as the tie-break (replacing the index on the reference alone).
 */
export async function up(knex: Knex): Promise<void> {
  await knex.raw(`
    create index register_entry_decided_idx on register_entry ((content->>'decidedOn'), seq);
    create index register_entry_co2e_idx on register_entry (((content->'figures'->>'co2eTotal')::float8), seq);
    create index register_entry_reference_seq_idx on register_entry (reference, seq);
    drop index register_entry_reference_idx;
  `);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw(`
    create index register_entry_reference_idx on register_entry (reference);
    drop index register_entry_reference_seq_idx;
    drop index register_entry_co2e_idx;
    drop index register_entry_decided_idx;
  `);
}
