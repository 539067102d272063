/**
 * Writes a synthetic 20 000-parcel zipped shapefile (EPSG:32628, WGS 84 / UTM zone 28N) for
 * the ingest benchmark. The output is large and must not be committed: pass a git-ignored path.
 * Run: node --import tsx gis/make-bench.ts .data/bench/parcels-20k.zip [parcelCount]
 */
import { mkdirSync, writeFileSync } from 'node:fs';
import { dirname } from 'node:path';
import { createRequire } from 'node:module';
import { deflateRawSync } from 'node:zlib';
import { crsFromEpsg } from '../src/lib/gis/crs-catalogue.server';
import { writePolygonShapefile } from '../src/lib/gis/export/shapefile-writer';
import { createZip } from '../src/lib/gis/export/zip-writer';
import { PARCEL_FIELDS } from './lib/attributes';
import { buildParcels } from './lib/demo-parcels';
import { seededRandom } from './lib/random';
import { CORROWMERE } from './lib/regions';

const [outPath, countArg] = process.argv.slice(2);
if (!outPath) {
  console.error('usage: node --import tsx gis/make-bench.ts <output.zip (git-ignored path)> [parcelCount=20000]');
  process.exit(2);
}
const count = Number(countArg ?? 20_000);
if (!Number.isInteger(count) || count < 1 || count > 200_000) {
  console.error(`parcelCount must be an integer from 1 to 200000, got "${countArg}"`);
  process.exit(2);
}
const cols = Math.ceil(Math.sqrt(count * 2));
const rows = Math.ceil(count / cols);
const region = { ...CORROWMERE, cols, rows };
const crs = await crsFromEpsg(region.epsg);
const started = performance.now();
const parcels = buildParcels(region, crs, seededRandom(7), 'BM', 900).slice(0, count);
const wkt = (createRequire(import.meta.url)(`epsg-index/s/${region.epsg}.json`) as { wkt: string }).wkt;
const files = writePolygonShapefile(parcels, { fields: [...PARCEL_FIELDS], prjWkt: wkt });
const zip = createZip(
  [
    { name: 'bench_parcels.shp', data: files.shp },
    { name: 'bench_parcels.shx', data: files.shx },
    { name: 'bench_parcels.dbf', data: files.dbf },
    { name: 'bench_parcels.cpg', data: files.cpg },
    { name: 'bench_parcels.prj', data: files.prj! },
  ],
  { deflateRaw: (b) => deflateRawSync(b) },
);
mkdirSync(dirname(outPath), { recursive: true });
writeFileSync(outPath, zip);
const seconds = ((performance.now() - started) / 1000).toFixed(1);
console.log(
  `wrote ${outPath}: ${parcels.length} parcels (${cols}×${rows} grid, EPSG:${region.epsg}), ${zip.length} bytes, ${seconds} s`,
);
