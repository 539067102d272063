/**
 * The authority's GIS settings: upload limits, validation tolerances, land-use look-back
 * windows and the optional basemap. Stored in app_setting (key → jsonb); defaults here (pure).
 */
import { z } from 'zod';

export const gisSettingsSchema = z.object({
  'upload.max-bytes': z
    .number()
    .int()
    .positive()
    .default(25 * 1024 * 1024),
  'upload.max-uncompressed-bytes': z
    .number()
    .int()
    .positive()
    .default(250 * 1024 * 1024),
  'upload.max-zip-entries': z.number().int().positive().default(1000),
  'upload.staging-hours': z.number().positive().default(24),
  /** Slivers: parcels below this are rejected, m² (common practice: 0.01 ha). */
  'validation.min-area-m2': z.number().nonnegative().default(100),
  /** Commission Implementing Regulation (EU) No 809/2014, Art. 38(4): 1.25 m buffer on the perimeter … */
  'validation.area-tolerance-m-per-m': z.number().nonnegative().default(1.25),
  /** … capped at 1.0 ha. */
  'validation.area-tolerance-cap-m2': z.number().nonnegative().default(10_000),
  'validation.area-mismatch': z.enum(['reject', 'warn']).default('reject'),
  /** Overlap between parcels is an error above this share of the smaller parcel … (common practice: ignore digitising slivers along shared edges) */
  'validation.overlap-max-share': z.number().min(0).max(1).default(0.02),
  /** … and above this area, m². Below either it is a warning. */
  'validation.overlap-max-m2': z.number().nonnegative().default(100),
  /** Near-duplicate: the symmetric difference is at most this share of the larger parcel. */
  'validation.near-duplicate-share': z.number().min(0).max(1).default(0.05),
  /** Regulation (EU) 2021/2115 Art. 4(3)(c): 5 years out of rotation. */
  'land-use.permanent-grassland-years': z.number().int().positive().default(5),
  /** England EIA (Agriculture) screening guidance: 15 years uncultivated. */
  'land-use.uncultivated-years': z.number().int().positive().default(15),
  'land-use.tillage-ends-grassland': z.boolean().default(false),
  /** XYZ tile URL of a real basemap ({z}/{x}/{y}); null = the authority's own layers only. */
  'map.basemap-url': z.string().url().nullable().default(null),
});

export function overlapTolerance(s: GisSettings) {
  return {
    maxShare: s['validation.overlap-max-share'],
    maxM2: s['validation.overlap-max-m2'],
    nearDuplicateShare: s['validation.near-duplicate-share'],
  };
}

export type GisSettings = z.output<typeof gisSettingsSchema>;
export const GIS_SETTING_KEYS = Object.keys(gisSettingsSchema.shape) as (keyof GisSettings)[];

/** Settings from stored rows; an invalid stored value fails loudly with its key. */
export function readGisSettings(rows: { key: string; value: unknown }[]): GisSettings {
  const stored = Object.fromEntries(
    rows.filter((r) => (GIS_SETTING_KEYS as string[]).includes(r.key)).map((r) => [r.key, r.value]),
  );
  const parsed = gisSettingsSchema.safeParse(stored);
  if (!parsed.success) {
    const i = parsed.error.issues[0]!;
    throw new Error(`setting "${String(i.path[0])}" is invalid: ${i.message}`);
  }
  return parsed.data;
}
