import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('proposal', (t) => {
    t.comment('A proposed change of use or management on one or more parcels, filed by a planner.');
    t.bigIncrements('id');
    t.text('reference')
      .notNullable()
      .unique({ indexName: 'proposal_reference_unique' })
      .comment('Public reference, e.g. P-2026-0007');
    t.text('title').notNullable();
    t.text('description').notNullable();
    t.integer('start_year').notNullable();
    t.jsonb('proposed')
      .notNullable()
      .comment("The carbon engine's `after` state (landUse, system, tillage, input | management, input)");
    t.text('state').notNullable().defaultTo('draft');
    t.text('applicant_name').notNullable().comment('PRIVATE: never on public pages, tiles or exports');
    t.text('applicant_contact').notNullable().comment('PRIVATE');
    t.text('applicant_interest').notNullable().comment('PRIVATE: owner, tenant or agent');
    t.integer('version')
      .notNullable()
      .defaultTo(1)
      .comment('Row version for optimistic locking; every write sends the version it read');
    t.timestamp('submitted_at', { useTz: true }).comment(
      'The latest valid submission: the statutory clock starts here',
    );
    t.date('decision_due').comment('Decision deadline: submission date + the decision-days setting');
    t.text('created_by').references('id').inTable('user').onDelete('SET NULL');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.text('updated_by').references('id').inTable('user').onDelete('SET NULL');
    t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.check(
      "state in ('draft', 'submitted', 'returned', 'in-assessment', 'assessed', 'withdrawn', 'on-agenda', 'decided')",
      [],
      'proposal_state_check',
    );
    t.check("applicant_interest in ('owner', 'tenant', 'agent')", [], 'proposal_interest_check');
    t.index(['state'], 'proposal_state_idx');
  });

  await knex.schema.createTable('proposal_parcel', (t) => {
    t.comment('A parcel a proposal names, whole or a drawn part of it.');
    t.bigInteger('proposal_id').notNullable().references('id').inTable('proposal').onDelete('CASCADE');
    t.bigInteger('parcel_id').notNullable().references('id').inTable('parcel').onDelete('RESTRICT');
    t.integer('position').notNullable();
    t.specificType('part', 'geometry(MultiPolygon, 4326)').comment(
      'The drawn part inside the parcel; null = the whole parcel',
    );
    t.double('area_ha').notNullable().comment('Ellipsoidal area of the part, or the parcel area when whole');
    t.primary(['proposal_id', 'parcel_id']);
    t.index(['parcel_id'], 'proposal_parcel_parcel_idx');
  });

  await knex.schema.createTable('proposal_event', (t) => {
    t.comment('Every change of state of a proposal, with who, when and why.');
    t.bigIncrements('id');
    t.bigInteger('proposal_id').notNullable().references('id').inTable('proposal').onDelete('CASCADE');
    t.text('from_state');
    t.text('to_state').notNullable();
    t.text('reason');
    t.text('by').references('id').inTable('user').onDelete('SET NULL');
    t.timestamp('at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['proposal_id'], 'proposal_event_proposal_idx');
  });

  await knex.schema.createTable('proposal_attachment', (t) => {
    t.comment('Documents filed with a proposal (PDF, PNG, JPEG; type checked by content).');
    t.uuid('id').primary();
    t.bigInteger('proposal_id').notNullable().references('id').inTable('proposal').onDelete('CASCADE');
    t.text('file_name').notNullable();
    t.text('media_type').notNullable();
    t.integer('size_bytes').notNullable();
    t.text('sha256').notNullable();
    t.binary('bytes').notNullable();
    t.text('uploaded_by').references('id').inTable('user').onDelete('SET NULL');
    t.timestamp('uploaded_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.check("media_type in ('application/pdf', 'image/png', 'image/jpeg')", [], 'proposal_attachment_type_check');
    t.index(['proposal_id'], 'proposal_attachment_proposal_idx');
  });

  await knex.schema.createTable('assessment', (t) => {
    t.comment('One version of the assessment of a proposal: a draft the assessor re-runs, then signed and frozen.');
    t.bigIncrements('id');
    t.bigInteger('proposal_id').notNullable().references('id').inTable('proposal').onDelete('CASCADE');
    t.integer('number').notNullable().comment('Assessment version of the proposal: 1, 2, ...');
    t.text('status').notNullable().defaultTo('draft');
    t.integer('version').notNullable().defaultTo(1).comment('Row version for optimistic locking');
    t.jsonb('inputs')
      .notNullable()
      .comment('What the assessor chose: factor set, GWP, current states, alternatives, each override with its reason');
    t.jsonb('result').notNullable().comment('Every output and the overlay used (frozen when signed)');
    t.text('factor_set_id').notNullable();
    t.integer('factor_set_version').notNullable();
    t.text('rule_set_id');
    t.integer('rule_set_version');
    t.integer('grade_level');
    t.text('grade_label');
    t.double('co2e_total');
    t.text('findings');
    t.text('signed_by').references('id').inTable('user').onDelete('SET NULL');
    t.timestamp('signed_at', { useTz: true });
    t.text('created_by').references('id').inTable('user').onDelete('SET NULL');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.text('updated_by').references('id').inTable('user').onDelete('SET NULL');
    t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.unique(['proposal_id', 'number'], { indexName: 'assessment_number_unique' });
    t.check("status in ('draft', 'signed')", [], 'assessment_status_check');
  });
  await knex.raw("create unique index assessment_one_draft on assessment (proposal_id) where status = 'draft'");
  // A signed assessment is frozen: nothing may change it afterwards.
  await knex.raw(`
    create function assessment_frozen() returns trigger language plpgsql as $$
    begin
      if old.status = 'signed' then
        raise exception 'assessment % is signed and frozen; re-assess to make a new version', old.id using errcode = 'check_violation';
      end if;
      return case when tg_op = 'DELETE' then old else new end;
    end $$;
    create trigger assessment_frozen before update or delete on assessment for each row execute function assessment_frozen();
  `);
  await knex.raw('create sequence proposal_reference_seq');
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('drop sequence if exists proposal_reference_seq');
  await knex.schema.dropTable('assessment');
  await knex.raw('drop function if exists assessment_frozen()');
  await knex.schema.dropTable('proposal_attachment');
  await knex.schema.dropTable('proposal_event');
  await knex.schema.dropTable('proposal_parcel');
  await knex.schema.dropTable('proposal');
}
