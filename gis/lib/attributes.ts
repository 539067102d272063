import type { AttributeValue } from '../../src/lib/gis/types';
import type { Random } from './random';

/**
 * Invented parcel attributes for the demo: references, local field names (invented, with a
 * few accented letters to exercise UTF-8), land use, management, last tillage date, holding
 * codes. No real people, holdings or places.
 */
const NAME_FIRST = ['Lower', 'Upper', 'Long', 'Broad', 'Old', 'Far', 'Near', 'Little', 'Great', 'West', 'East'];
const NAME_SECOND = [
  'Fenmoor',
  'Ashrindle',
  'Ríoghbrook',
  'Haldrennow',
  'Skarrowen',
  'Émbrenlea',
  'Corrow Field',
  'Tollivane',
  'Brackwater',
  'Søvrinholt',
  'Quarrelby',
  'Mireside',
];
const TROPICAL_NAMES = [
  'Keluvo Ridge',
  'Tembiri Flats',
  'Orapesi Slope',
  'Lunavai Field',
  'Marutesa Plot',
  'Ivolani Bench',
];

/** Reference date for generated dates (fixed, so output never depends on the clock). */
export const DEMO_AS_OF = '2025-06-30';

export interface ParcelContext {
  index: number;
  prefix: string;
  holdings: number;
  inNeverTilled: boolean;
  tropical: boolean;
}

function dateYearsAgo(random: Random, minYears: number, maxYears: number): string {
  const days = Math.floor(random.range(minYears * 365.25, maxYears * 365.25));
  const t = Date.UTC(2025, 5, 30) - days * 86_400_000;
  return new Date(t).toISOString().slice(0, 10);
}

export function parcelAttributes(ctx: ParcelContext, random: Random): Record<string, AttributeValue> {
  const roll = random.next();
  let landUse = roll < 0.6 ? 'grassland' : roll < 0.75 ? 'temporary-grassland' : roll < 0.9 ? 'arable' : 'meadow';
  if (ctx.inNeverTilled) landUse = random.next() < 0.7 ? 'grassland' : 'meadow';
  const management =
    landUse === 'arable'
      ? 'cropped'
      : landUse === 'meadow'
        ? random.pick(['hay', 'ungrazed'])
        : random.pick(['grazed', 'cut-for-silage', 'mixed', 'grazed']);
  let lastTill: string | null = null;
  if (!ctx.inNeverTilled) {
    if (landUse === 'arable') lastTill = dateYearsAgo(random, 0.2, 1.5);
    else if (landUse === 'temporary-grassland') lastTill = dateYearsAgo(random, 1.5, 4.5);
    else if (random.next() < 0.6) lastTill = dateYearsAgo(random, 6, 35);
  }
  const names = ctx.tropical ? TROPICAL_NAMES : NAME_SECOND;
  return {
    field_ref: `${ctx.prefix}-${String(ctx.index + 1).padStart(4, '0')}`,
    name: `${random.pick(NAME_FIRST)} ${random.pick(names)}`,
    land_use: landUse,
    management,
    last_till: lastTill,
    owner_ref: `HLD-${String(100 + random.int(ctx.holdings)).padStart(3, '0')}`,
    stated_ha: null,
  };
}

/** DBF layout of the demo parcel tables (names ≤ 10 characters). */
export const PARCEL_FIELDS = [
  { name: 'field_ref', type: 'C', length: 12 },
  { name: 'name', type: 'C', length: 40 },
  { name: 'land_use', type: 'C', length: 20 },
  { name: 'management', type: 'C', length: 16 },
  { name: 'last_till', type: 'D', length: 8 },
  { name: 'owner_ref', type: 'C', length: 8 },
  { name: 'stated_ha', type: 'N', length: 12, decimals: 4 },
] as const;
