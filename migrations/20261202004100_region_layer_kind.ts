import type { Knex } from 'knex';

/** Accounting regions (districts) become a reference-layer kind. */
export async function up(knex: Knex): Promise<void> {
  await knex.raw('alter table reference_layer_version drop constraint reference_layer_version_kind_check');
  await knex.raw(
    'alter table reference_layer_version add constraint reference_layer_version_kind_check check (kind in ' +
      "('climate', 'soil', 'sensitive', 'slope', 'never-tilled', 'region'))",
  );
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('alter table reference_layer_version drop constraint reference_layer_version_kind_check');
  await knex.raw(
    'alter table reference_layer_version add constraint reference_layer_version_kind_check check (kind in ' +
      "('climate', 'soil', 'sensitive', 'slope', 'never-tilled'))",
  );
}
