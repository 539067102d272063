/**
 * Loads the invented demo region (gis/demo/) through the same services as the app: the six
 * reference layers (climate, soil, sensitive, slope, never-tilled, accounting regions) are uploaded, validated, saved and published by the demo admin; the
 * Corrowmere parcels (zipped shapefile in EPSG:32628, so reprojection runs) and the Velomari
 * parcels (GeoJSON) are imported by the demo planner. Then each parcel gets an invented,
 * deterministic land-use history so the status flags have something to derive from.
 */
import { readFileSync } from 'node:fs';
import { recordAudit } from '../../src/lib/db/audit';
import { db } from '../../src/lib/db/client';
import { parseRoles } from '../../src/lib/auth/roles';
import type { Caller } from '../../src/lib/http/handle';
import { publishLayerVersion } from '../../src/lib/services/reference-layers';
import { enterReferenceRatio } from '../../src/lib/services/regions';
import { saveUpload } from '../../src/lib/services/upload-save';
import { stageUpload, type UploadPurpose } from '../../src/lib/services/upload-stage';
import { validateUpload } from '../../src/lib/services/upload-validate';

const DEMO_DIR = new URL('../../gis/demo/', import.meta.url);

const LAYERS = [
  { file: 'climate-regions.geojson', kind: 'climate' },
  { file: 'soil-units.geojson', kind: 'soil' },
  { file: 'sensitive-grassland.geojson', kind: 'sensitive', labelAttribute: 'name' },
  { file: 'slope-classes.geojson', kind: 'slope' },
  { file: 'never-tilled-grassland.geojson', kind: 'never-tilled' },
  { file: 'districts.geojson', kind: 'region', labelAttribute: 'name' },
] as const;

const PARCEL_MAPPING = {
  reference: 'field_ref',
  name: 'name',
  landUse: 'land_use',
  management: 'management',
  lastTillage: 'last_till',
  ownerRef: 'owner_ref',
  statedArea: 'stated_ha',
  statedAreaUnit: 'ha',
};

export async function caller(email: string): Promise<Caller> {
  const u = await db('user').where({ email }).first();
  if (!u) throw new Error(`demo user ${email} is missing`);
  return { id: u.id, name: u.name, email: u.email, roles: parseRoles(u.role) };
}

async function importFile(by: Caller, purpose: UploadPurpose, file: string, mapping: Record<string, unknown>) {
  const staged = await stageUpload(by, {
    purpose,
    fileName: file,
    bytes: new Uint8Array(readFileSync(new URL(file, DEMO_DIR))),
  });
  const layer = staged.layers[0]!;
  const report = await validateUpload(by, staged.id, { layer: layer.name, mapping });
  const saved = await saveUpload(by, staged.id);
  return { report, saved, crs: report.crs };
}

/** Invented histories: older grassland records, arable spells before re-sown grass. Deterministic. */
async function addHistories(by: Caller): Promise<number> {
  const evidence = 'Demo history (invented): Upper Tarrow land-cover survey';
  const r = await db.raw(
    `insert into land_use_event (parcel_id, event_date, kind, value, evidence, recorded_by)
     select p.id, d.date, 'land-use', d.value, ?, ? from parcel p
     left join lateral (select max(event_date) t from land_use_event e where e.parcel_id = p.id and e.kind = 'tillage') till on true
     cross join lateral (
       select date '2003-05-01' as date, 'grassland' as value where till.t is null and p.land_use in ('grassland', 'meadow')
       union all select till.t, 'arable' where till.t is not null
       union all select (till.t + interval '1 year')::date, p.land_use where till.t is not null and p.land_use <> ` +
      `'arable' and till.t + interval '1 year' < current_date
       union all select date '1998-04-01', 'grassland' where till.t is not null and p.id % 3 = 0
     ) d`,
    [evidence, by.id],
  );
  await recordAudit(db, {
    actorId: by.id,
    action: 'parcel.seed-history',
    entityType: 'parcel',
    entityId: 'demo',
    details: { events: r.rowCount },
  });
  return r.rowCount ?? 0;
}

/**
 * Reference ratios (2018) of the demo districts: the invented history does not reach back to
 * 2018, so the demo admin enters them, as an authority would from its census.
 */
export const DEMO_REFERENCE_RATIOS = { skarrow: 0.82, fenbrook: 0.72, tembiri: 0.78 } as const;

async function addReferenceRatios(by: Caller): Promise<void> {
  for (const [key, ratio] of Object.entries(DEMO_REFERENCE_RATIOS)) {
    await enterReferenceRatio(by, key, {
      referenceYear: 2018,
      ratio,
      source: 'Upper Tarrow farm census 2018, table 3 (invented demo figure)',
    });
  }
}

export async function seedDemoRegion(adminEmail: string, plannerEmail: string): Promise<string> {
  const [{ n }] = await db('parcel').count<{ n: number }[]>('* as n');
  const [{ m }] = await db('reference_layer_version').count<{ m: number }[]>('* as m');
  if (Number(n) > 0 || Number(m) > 0) return 'demo region not added (parcels or reference layers exist)';
  const admin = await caller(adminEmail);
  const planner = await caller(plannerEmail);
  for (const l of LAYERS) {
    const { saved } = await importFile(admin, 'reference', l.file, {
      kind: l.kind,
      classAttribute: 'class',
      ...('labelAttribute' in l ? { labelAttribute: l.labelAttribute } : {}),
    });
    await publishLayerVersion(admin, saved.referenceVersion!.id, 'Demo region (invented)');
  }
  const cm = await importFile(planner, 'parcels', 'corrowmere-parcels-utm28n.zip', PARCEL_MAPPING);
  const vm = await importFile(planner, 'parcels', 'velomari-parcels.geojson', PARCEL_MAPPING);
  const events = await addHistories(planner);
  await addReferenceRatios(admin);
  return (
    `demo region added: ${LAYERS.length} reference layers; Corrowmere ${cm.saved.saved} parcels from ` +
    `EPSG:${cm.crs.epsg} (${cm.saved.rejected} rejected by validation), Velomari ${vm.saved.saved} ` +
    `(${vm.saved.rejected} rejected); ${events} history events; reference ratios of ${Object.keys(DEMO_REFERENCE_RATIOS).length} districts`
  );
}
