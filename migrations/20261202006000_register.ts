import type { Knex } from 'knex';

/**
 * The public register of decisions: append-only and hash-chained. Each entry stores the SHA-256
 * of the RFC 8785 canonical JSON of { content, prevHash, seq }; nothing may update, delete or
 * truncate an entry (trigger), and the writer role holds no UPDATE, DELETE or TRUNCATE privilege.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('register_entry', (t) => {
    t.comment(
      'Append-only, hash-chained public register of board decisions, corrections and appeal outcomes. No personal data.',
    );
    t.bigInteger('seq').primary().comment('1, 2, 3 ... without gaps; appended under an advisory lock');
    t.text('prev_hash').notNullable().comment('hash of entry seq - 1 (64 zeros for the first entry)');
    t.text('hash').notNullable().comment('SHA-256 hex of the RFC 8785 canonical JSON of { content, prevHash, seq }');
    t.jsonb('content')
      .notNullable()
      .comment('The public content of the entry (never applicants, owners, holdings or votes by name)');
    t.bigInteger('supersedes_seq')
      .references('seq')
      .inTable('register_entry')
      .onDelete('RESTRICT')
      .comment('The entry a correction or appeal outcome replaces');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.check('seq >= 1', [], 'register_entry_seq_check');
    t.check("hash ~ '^[0-9a-f]{64}$' and prev_hash ~ '^[0-9a-f]{64}$'", [], 'register_entry_hash_check');
    t.unique(['hash'], { indexName: 'register_entry_hash_unique' });
  });
  // Filter and sort columns, derived from the content (so they can never disagree with it).
  await knex.raw(`
    alter table register_entry
      add column outcome text generated always as (content->>'outcome') stored,
      add column decided_year int generated always as ((left(content->>'decidedOn', 4))::int) stored,
      add column risk_level int generated always as ((content->'risk'->>'level')::int) stored,
      add column area_ha double precision generated always as ((content->>'areaHa')::double precision) stored,
      add column region text generated always as (content->>'region') stored,
      add column reference text generated always as (content->'proposal'->>'reference') stored;
    create index register_entry_outcome_idx on register_entry (outcome, seq);
    create index register_entry_year_idx on register_entry (decided_year, seq);
    create index register_entry_risk_idx on register_entry (risk_level, seq);
    create index register_entry_area_idx on register_entry (area_ha, seq);
    create index register_entry_region_idx on register_entry (region, seq);
    create index register_entry_reference_idx on register_entry (reference);
    create index register_entry_supersedes_idx on register_entry (supersedes_seq);
  `);
  await knex.raw(`
    create function register_entry_append_only() returns trigger language plpgsql as $$
    begin
      raise exception 'register entries are append-only: % is not allowed; record a correction as a new entry', tg_op
        using errcode = 'insufficient_privilege';
    end $$;
    create trigger register_entry_no_update before update or delete on register_entry for each row execute function register_entry_append_only();
    create trigger register_entry_no_truncate before truncate on register_entry for each statement execute function register_entry_append_only();
    revoke update, delete, truncate on register_entry from public;
  `);
  // A role for code that appends (the app may connect as it): it may read and insert, never change.
  await knex.raw(`
    do $$ begin
      if not exists (select 1 from pg_roles where rolname = 'swardkeep_register_writer') then
        create role swardkeep_register_writer nologin;
      end if;
    end $$;
    do $$ begin execute format('grant usage on schema %I to swardkeep_register_writer', current_schema()); end $$;
    grant select, insert on register_entry to swardkeep_register_writer;
    revoke update, delete, truncate on register_entry from swardkeep_register_writer;
  `);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('revoke all on register_entry from swardkeep_register_writer');
  await knex.schema.dropTable('register_entry');
  await knex.raw('drop function if exists register_entry_append_only()');
}
