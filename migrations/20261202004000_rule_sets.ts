import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('rule_set', (t) => {
    t.comment(
      'A named set of risk-grading rules (the screening rules of an authority). Documents live in its versions.',
    );
    t.text('id').primary().comment('kebab-case, e.g. tarrow-screening');
    t.text('title').notNullable();
    t.text('description').notNullable();
    t.text('origin').notNullable().comment('shipped (read-only, from src/lib/rules/rule-sets) or custom');
    t.text('based_on_id');
    t.integer('based_on_version');
    t.text('created_by').references('id').inTable('user').onDelete('SET NULL');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.check("origin in ('shipped', 'custom')", [], 'rule_set_origin_check');
  });

  await knex.schema.createTable('rule_set_version', (t) => {
    t.comment(
      'One version of a rule set. Published versions are immutable (trigger rule_set_version_immutable); an assessment names the version it used.',
    );
    t.text('set_id').notNullable().references('id').inTable('rule_set').onDelete('RESTRICT');
    t.integer('version').notNullable();
    t.text('status').notNullable().comment('draft (editable by admins) or published (immutable)');
    t.jsonb('document').notNullable().comment('RuleSetDocument, validated by ruleSetDocumentSchema');
    t.integer('revision')
      .notNullable()
      .defaultTo(1)
      .comment('row version of a draft, +1 on every edit; a stale edit gets 409');
    t.text('publish_note');
    t.text('published_by').references('id').inTable('user').onDelete('SET NULL');
    t.timestamp('published_at', { useTz: true });
    t.text('created_by').references('id').inTable('user').onDelete('SET NULL');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.primary(['set_id', 'version']);
    t.check("status in ('draft', 'published')", [], 'rule_set_version_status_check');
  });
  await knex.raw("create unique index rule_set_one_draft on rule_set_version (set_id) where status = 'draft'");
  // A published version never changes and is never deleted, whoever writes to the database.
  // (ON DELETE SET NULL of the user columns must still work, so only status and document are guarded.)
  await knex.raw(
    `
    create function rule_set_version_guard() returns trigger language plpgsql as $$
    begin
      if tg_op = 'DELETE' then
        if old.status = 'published' then raise exception 'rule set % version % is published and cannot be deleted',` +
      ` old.set_id, old.version using errcode = 'integrity_constraint_violation'; end if;
        return old;
      end if;
      if old.status = 'published' and (new.status is distinct from old.status or new.document is distinct from ` +
      `old.document or new.version is distinct from old.version
          or new.set_id is distinct from old.set_id or new.revision is distinct from old.revision or ` +
      `new.published_at is distinct from old.published_at or new.publish_note is distinct from old.publish_note) then
        raise exception 'rule set % version % is published and cannot be changed', old.set_id, old.version using errcode = 'integrity_constraint_violation';
      end if;
      return new;
    end $$`,
  );
  await knex.raw(
    'create trigger rule_set_version_immutable before update or delete on rule_set_version for each row execute function rule_set_version_guard()',
  );

  await knex.schema.createTable('rule_edit', (t) => {
    t.comment('Every change to a rule of a draft, with its required reason.');
    t.bigIncrements('id');
    t.text('set_id').notNullable();
    t.integer('version').notNullable();
    t.text('rule_id').notNullable();
    t.text('action').notNullable().comment('put (add or replace a rule) or remove');
    t.jsonb('before').comment('the rule before, null when added');
    t.jsonb('after').comment('the rule after, null when removed');
    t.text('reason').notNullable();
    t.text('edited_by').references('id').inTable('user').onDelete('SET NULL');
    t.timestamp('edited_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.foreign(['set_id', 'version'], 'rule_edit_version_fk')
      .references(['set_id', 'version'])
      .inTable('rule_set_version')
      .onDelete('CASCADE');
    t.check("action in ('put', 'remove')", [], 'rule_edit_action_check');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('rule_edit');
  await knex.raw('drop trigger rule_set_version_immutable on rule_set_version');
  await knex.schema.dropTable('rule_set_version');
  await knex.raw('drop function rule_set_version_guard()');
  await knex.schema.dropTable('rule_set');
}
