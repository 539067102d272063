/**
 * Writes gis/demo/corrowmere-north-block.geojson: a neighbouring block of 40 invented fields just
 * north of the seeded Corrowmere fields, NOT loaded by the seed, for a newcomer's first upload
 * (README, "First ten minutes"). Deterministic (same seed, same bytes); dates relative to
 * 2025-06-30. Two deliberate defects show the checks: one land use not on the list, and one
 * extra field drawn half over each of two neighbours (CN-0039, CN-0040).
 * Run: node --import tsx gis/make-demo-north.ts
 */
import { writeFileSync } from 'node:fs';
import type { Feature, Polygon } from 'geojson';
import { crsFromEpsg } from '../src/lib/gis/crs-catalogue.server';
import { toWgs84 } from '../src/lib/gis/crs';
import { parcelAttributes } from './lib/attributes';
import { regionOrigin } from './lib/demo-parcels';
import { seededRandom } from './lib/random';
import { CORROWMERE } from './lib/regions';

const SEED = 20_251_202;
const [COLS, ROWS, W, H] = [10, 4, 240, 200];
/** Grid start in metres from the Corrowmere origin: north of its 15 rows of 210 m (gis/lib/regions.ts). */
const [X0, Y0] = [2000, 3250];
const round7 = (n: number) => Math.round(n * 1e7) / 1e7;

const crs = await crsFromEpsg(CORROWMERE.epsg);
const origin = regionOrigin(CORROWMERE, crs);
const random = seededRandom(SEED);
const ring = (x: number, y: number, w: number, h: number) =>
  [
    [x, y],
    [x + w, y],
    [x + w, y + h],
    [x, y + h],
    [x, y],
  ].map(([ex, ny]) => toWgs84([origin[0]! + ex!, origin[1]! + ny!], crs).map(round7));
const yearsAgo = (min: number, max: number) =>
  new Date(Date.UTC(2025, 5, 30) - Math.floor(random.range(min * 365.25, max * 365.25)) * 86_400_000)
    .toISOString()
    .slice(0, 10);

const features: Feature<Polygon>[] = [];
for (let row = 0; row < ROWS; row++) {
  for (let col = 0; col < COLS; col++) {
    const index = row * COLS + col;
    const a = parcelAttributes({ index, prefix: 'CN', holdings: 12, inNeverTilled: false, tropical: false }, random);
    const grass = a.land_use !== 'arable';
    const inGrass = !grass ? null : a.last_till ? String(a.last_till) : yearsAgo(6, 40);
    const { stated_ha: _s, ...rest } = a;
    features.push({
      type: 'Feature',
      properties: { ...rest, in_grass: inGrass },
      geometry: { type: 'Polygon', coordinates: [ring(X0 + col * W, Y0 + row * H, W, H)] },
    });
  }
}
features[16]!.properties!.land_use = 'Permanent pasture';
features.push({
  type: 'Feature',
  properties: {
    field_ref: 'CN-0041',
    name: 'Corrow Field annex',
    land_use: 'grassland',
    management: 'grazed',
    last_till: null,
    owner_ref: 'HLD-104',
    in_grass: '2001-04-01',
  },
  geometry: { type: 'Polygon', coordinates: [ring(X0 + 9 * W - W / 2, Y0 + 3 * H, W, H)] },
});
writeFileSync(
  new URL('./demo/corrowmere-north-block.geojson', import.meta.url),
  `${JSON.stringify({ type: 'FeatureCollection', features })}\n`,
);
console.log(`wrote gis/demo/corrowmere-north-block.geojson (${features.length} fields)`);
