import type { Knex } from 'knex';

/**
 * The committed CO2e of a budget year (`committedCo2e`, read by every assessment and screening run)
 * sums current approvals of proposals starting that year. Start year and CO2e total become
 * generated columns (derived from the content, so they cannot disagree with it) and a partial
 * index of approvals carries both, so the sum reads the index, not the whole register.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.raw(`
    alter table register_entry
      add column start_year int generated always as ((content->'proposal'->>'startYear')::int) stored,
      add column co2e_total double precision generated always as ((content->'figures'->>'co2eTotal')::double precision) stored;
    create index register_entry_committed_idx on register_entry (start_year) include (co2e_total, seq)
      where outcome in ('approved', 'approved-with-conditions');
  `);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw(
    'drop index register_entry_committed_idx; alter table register_entry drop column start_year, drop column co2e_total',
  );
}
