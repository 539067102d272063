/**
 * Writes the invented demo region to gis/demo/ (deterministic: same seed, same bytes).
 * Run: node --import tsx gis/make-demo.ts
 */
import { mkdirSync, writeFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { deflateRawSync } from 'node:zlib';
import type { Feature, Polygon } from 'geojson';
import { crsFromEpsg } from '../src/lib/gis/crs-catalogue.server';
import { reproject, type CrsDefinition } from '../src/lib/gis/crs';
import { writePolygonShapefile } from '../src/lib/gis/export/shapefile-writer';
import { createZip } from '../src/lib/gis/export/zip-writer';
import { DEMO_AS_OF, PARCEL_FIELDS } from './lib/attributes';
import { addDefects, buildParcels, regionOrigin, type DemoParcel } from './lib/demo-parcels';
import { boxFeatures, collection } from './lib/layers';
import { seededRandom } from './lib/random';
import { CORROWMERE, VELOMARI, type RegionSpec } from './lib/regions';

const OUT = new URL('./demo/', import.meta.url);
const SEED = 20_250_630;
const round7 = (n: number) => Math.round(n * 1e7) / 1e7;

function prjWkt(epsg: number): string {
  return (createRequire(import.meta.url)(`epsg-index/s/${epsg}.json`) as { wkt: string }).wkt;
}

function write(name: string, data: Uint8Array | string): void {
  writeFileSync(new URL(name, OUT), data);
  console.log(`wrote gis/demo/${name}`);
}

function shapefileZip(parcels: DemoParcel[], layer: string, prj: string | null): Uint8Array {
  const files = writePolygonShapefile(parcels, { fields: [...PARCEL_FIELDS], prjWkt: prj });
  const entries = [
    { name: `${layer}.shp`, data: files.shp },
    { name: `${layer}.shx`, data: files.shx },
    { name: `${layer}.dbf`, data: files.dbf },
    { name: `${layer}.cpg`, data: files.cpg },
    ...(files.prj ? [{ name: `${layer}.prj`, data: files.prj }] : []),
  ];
  return createZip(entries, { deflateRaw: (b) => deflateRawSync(b, { level: 9 }) });
}

function referenceLayers(region: RegionSpec, crs: CrsDefinition) {
  const o = regionOrigin(region, crs);
  const l = region.layers;
  const tag = { region: region.key };
  return {
    climate: l.climate.flatMap(([cls, boxes]) => boxFeatures(o, crs, cls, boxes, tag)),
    soil: l.soil.flatMap(([cls, boxes]) => boxFeatures(o, crs, cls, boxes, tag)),
    slope: l.slope.flatMap(([cls, boxes]) => boxFeatures(o, crs, cls, boxes, tag)),
    sensitive: l.sensitive.flatMap((s) =>
      boxFeatures(o, crs, 'sensitive-grassland', [s.box], { ...tag, name: s.name, site_code: s.code }),
    ),
    neverTilled: boxFeatures(o, crs, 'never-tilled', l.neverTilled, tag),
    districts: l.districts.flatMap((d) => boxFeatures(o, crs, d.key, d.boxes, { ...tag, name: d.name })),
  };
}

function toGeoJsonFeatures(parcels: DemoParcel[], crs: CrsDefinition): Feature[] {
  return parcels.map((p) => {
    const g = p.geometry ? reproject(p.geometry, crs) : null;
    const geometry: Polygon | null = g && {
      type: 'Polygon',
      coordinates: g.coordinates.map((r) => r.map((q) => q.map(round7))),
    };
    return { type: 'Feature', properties: p.properties, geometry } as Feature;
  });
}

async function main(): Promise<void> {
  mkdirSync(OUT, { recursive: true });
  const coolCrs = await crsFromEpsg(CORROWMERE.epsg);
  const tropCrs = await crsFromEpsg(VELOMARI.epsg);
  const cool = buildParcels(CORROWMERE, coolCrs, seededRandom(SEED), 'CM', 40);
  const coolDefects = addDefects(cool, 'CM', [5, 12, 44, 63, 88, 101, 137, 170, 205, 233, 260, 288]);
  const trop = buildParcels(VELOMARI, tropCrs, seededRandom(SEED + 1), 'VM', 12);
  const tropDefects = addDefects(trop, 'VM', [7, 22]);
  // One GeoJSON parcel wound clockwise, which the validation report repairs (RFC 7946 §3.1.6).
  trop[15]!.geometry!.coordinates[0]!.reverse();
  tropDefects.push({
    field_ref: String(trop[15]!.properties.field_ref),
    defect: 'outer ring clockwise (ring-orientation, repaired)',
  });

  write('corrowmere-parcels-utm28n.zip', shapefileZip(cool, 'corrowmere_parcels', prjWkt(CORROWMERE.epsg)));
  write('corrowmere-parcels-noprj.zip', shapefileZip(cool, 'corrowmere_parcels', null));
  write('velomari-parcels.geojson', JSON.stringify(collection(toGeoJsonFeatures(trop, tropCrs))));

  const a = referenceLayers(CORROWMERE, coolCrs);
  const b = referenceLayers(VELOMARI, tropCrs);
  const layers = {
    'climate-regions.geojson': [...a.climate, ...b.climate],
    'soil-units.geojson': [...a.soil, ...b.soil],
    'slope-classes.geojson': [...a.slope, ...b.slope],
    'sensitive-grassland.geojson': [...a.sensitive, ...b.sensitive],
    'never-tilled-grassland.geojson': [...a.neverTilled, ...b.neverTilled],
    'districts.geojson': [...a.districts, ...b.districts],
  };
  for (const [name, features] of Object.entries(layers)) write(name, JSON.stringify(collection(features)));
  const manifest = {
    generatedBy: 'gis/make-demo.ts',
    seed: SEED,
    datesRelativeTo: DEMO_AS_OF,
    parcels: [
      {
        file: 'corrowmere-parcels-utm28n.zip',
        layer: 'corrowmere_parcels',
        crs: 'EPSG:32628',
        features: cool.length,
        defects: coolDefects,
      },
      {
        file: 'corrowmere-parcels-noprj.zip',
        layer: 'corrowmere_parcels',
        crs: 'none (.prj omitted; coordinates are EPSG:32628)',
        features: cool.length,
      },
      { file: 'velomari-parcels.geojson', crs: 'EPSG:4326', features: trop.length, defects: tropDefects },
    ],
    layers: Object.fromEntries(
      Object.entries(layers).map(([n, f]) => [
        n,
        { features: f.length, classes: [...new Set(f.map((x) => x.properties?.class))] },
      ]),
    ),
  };
  write('manifest.json', `${JSON.stringify(manifest, null, 2)}\n`);
}

await main();
