import type { Knex } from 'knex';
import { referenceKey } from '../src/lib/gis/references';

/**
 * Race-free parcel saves: references unique by their key (NFKC, case folded, look-alikes
 * mapped; src/lib/gis/references.ts), no invisible or text-direction control characters, no two
 * parcels with the same boundary; and a spatial index on staged features for the overlap checks.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('parcel', (t) => {
    t.text('reference_key').comment(
      'referenceKey(reference): NFKC, case folded, look-alike letters mapped (UTS #39); unique',
    );
  });
  const rows: { id: number; reference: string }[] = await knex('parcel').select('id', 'reference');
  for (const r of rows)
    await knex('parcel')
      .where({ id: r.id })
      .update({ reference_key: referenceKey(r.reference) });
  await knex.raw('alter table parcel alter column reference_key set not null');
  await knex.raw('create unique index parcel_reference_key_unique on parcel (reference_key)');
  // Cc, Cf (zero-width, soft hyphen, BOM, bidi embeddings/overrides/isolates), line/paragraph separators.
  await knex.raw(
    `alter table parcel add constraint parcel_reference_visible_check
       check (reference !~ ` +
      `'[\\u0000-\\u001f\\u007f-\\u009f\\u00ad\\u0600-\\u0605\\u061c\\u06dd\\u070f\\u180e` +
      `\\u200b-\\u200f\\u2028-\\u202e\\u2060-\\u2064\\u2066-\\u206f\\ufeff\\ufff9-\\ufffb]')`,
  );
  // Same boundary = same normalised geometry (ST_Normalize orders rings and vertices).
  await knex.raw('create unique index parcel_geom_unique on parcel (md5(st_asbinary(st_normalize(geom))))');
  await knex.raw('create index upload_staging_feature_geom_gist on upload_staging_feature using gist (geom)');
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('drop index upload_staging_feature_geom_gist');
  await knex.raw('drop index parcel_geom_unique');
  await knex.raw('alter table parcel drop constraint parcel_reference_visible_check');
  await knex.schema.alterTable('parcel', (t) => t.dropColumn('reference_key'));
}
