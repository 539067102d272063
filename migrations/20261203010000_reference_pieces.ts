import type { Knex } from 'knex';

/**
 * Reference features cut into small pieces (ST_Subdivide, at most 256 vertices each), made once per
 * feature by triggers when features are written (so no insert path can leave a feature without pieces). The overlay
 * tests parcels against the pieces: a test against a
 * small piece is cheap without PostGIS's prepared-geometry cache, and a parcel inside a piece needs no
 * intersection at all, so the overlay stays close to linear in the parcel count. Pieces of one feature
 * do not overlap; pieces of different features may (as the features may).
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('reference_piece', (t) => {
    t.comment(
      'A piece of a reference feature (ST_Subdivide), for the parcel overlay; the pieces of a feature cover it exactly.',
    );
    t.bigIncrements('id');
    t.bigInteger('version_id').notNullable().references('id').inTable('reference_layer_version').onDelete('CASCADE');
    t.bigInteger('feature_id').notNullable().references('id').inTable('reference_feature').onDelete('CASCADE');
    t.text('class').notNullable().comment('The class of the feature, copied so the overlay reads pieces only.');
    t.specificType('geom', 'geometry(Polygon, 4326)').notNullable();
    t.index(['version_id'], 'reference_piece_version_idx');
    t.index(['feature_id'], 'reference_piece_feature_idx');
  });
  await knex.raw('create index reference_piece_geom_gist on reference_piece using gist (geom)');
  // Statement-level triggers over the transition table: one set-based insert per statement, not one per feature.
  await knex.raw(`create function reference_piece_make() returns trigger language plpgsql as $$
    begin
      if tg_op = 'UPDATE' then delete from reference_piece where feature_id in (select id from new_rows); end if;
      insert into reference_piece (version_id, feature_id, class, geom)
        select f.version_id, f.id, f.class, d.geom from new_rows f
        cross join lateral (select (st_dump(st_subdivide(f.geom, 256))).geom) d
        where geometrytype(d.geom) = 'POLYGON' order by f.id;
      return null;
    end $$`);
  await knex.raw(`create trigger reference_piece_make after insert on reference_feature
    referencing new table as new_rows for each statement execute function reference_piece_make()`);
  await knex.raw(`create trigger reference_piece_remake after update on reference_feature
    referencing new table as new_rows for each statement execute function reference_piece_make()`);
  await knex.raw(`insert into reference_piece (version_id, feature_id, class, geom)
    select f.version_id, f.id, f.class, d.geom from reference_feature f
    cross join lateral (select (st_dump(st_subdivide(f.geom, 256))).geom) d where geometrytype(d.geom) = 'POLYGON' order by f.id`);
  await knex.raw('analyze reference_piece');
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('drop trigger reference_piece_make on reference_feature');
  await knex.raw('drop trigger reference_piece_remake on reference_feature');
  await knex.raw('drop function reference_piece_make()');
  await knex.schema.dropTable('reference_piece');
}
