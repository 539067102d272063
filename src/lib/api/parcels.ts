/** Contracts of the parcel and map routes. */
import { z } from 'zod';
import { EVENT_VALUES } from '../gis/land-use-events';
import { defineSpec } from '../http/spec';

const idParams = z.object({ id: z.coerce.number().int().positive('Parcel ids are positive whole numbers.') });
const position = z.array(z.number()).min(2).max(3);
/** A drawn boundary: Polygon or MultiPolygon in EPSG:4326 (checked in full by the validator). */
const boundary = z.union([
  z.object({ type: z.literal('Polygon'), coordinates: z.array(z.array(position)).min(1).max(100) }),
  z.object({
    type: z.literal('MultiPolygon'),
    coordinates: z
      .array(z.array(z.array(position)).min(1))
      .min(1)
      .max(100),
  }),
]);
const share = z.object({ class: z.string(), areaHa: z.number(), share: z.number() });
const kindSummary = z.object({
  kind: z.string(),
  layerVersion: z.number().nullable(),
  classes: z.array(share),
  dominant: z.string().nullable(),
  uncoveredShare: z.number(),
  flag: z.string().nullable(),
});
const flag = z.object({ value: z.boolean().nullable(), reason: z.string() });

export const getParcel = defineSpec({
  method: 'GET',
  path: '/api/parcels/{id}',
  tag: 'Parcels',
  summary:
    'A parcel: reference, area of record, land use, status flags with reasons, overlay (climate, soil fractions, designations, slope), history',
  access: 'signed-in',
  params: idParams,
  response: z.object({
    id: z.number(),
    reference: z.string(),
    name: z.string().nullable(),
    areaHa: z.number(),
    statedAreaHa: z.number().nullable(),
    landUse: z.string().nullable(),
    management: z.string().nullable(),
    ownerRef: z.string().nullable().describe('planners and admins only'),
    geometry: z.record(z.string(), z.unknown()),
    version: z.number(),
    source: z.object({
      kind: z.enum(['upload', 'drawn']),
      fileName: z.string().nullable(),
      savedAt: z.string().nullable(),
    }),
    flags: z.object({
      asOf: z.string(),
      currentLandUse: z.string().nullable(),
      permanentGrassland: flag,
      uncultivated: flag,
      neverTilled: flag,
    }),
    overlay: z.record(z.string(), kindSummary),
    history: z.array(
      z.object({
        id: z.number(),
        date: z.string(),
        kind: z.string(),
        value: z.string().nullable(),
        cultivation: z.boolean(),
        evidence: z.string(),
        recordedBy: z.string().nullable(),
        recordedAt: z.string(),
      }),
    ),
    proposals: z.array(z.object({ id: z.string(), title: z.string(), status: z.string() })),
  }),
});

const reference = z.string().trim().min(1, 'Give the parcel a reference.').max(60);
const evidence = z.string().trim().min(3, 'Say where this comes from (at least 3 characters).').max(500);

export const drawParcel = defineSpec({
  method: 'POST',
  path: '/api/parcels',
  tag: 'Parcels',
  summary: 'Add a parcel drawn on the map (validated like an upload: reference, land use, overlaps; overlaid, audited)',
  access: ['planner', 'admin'],
  body: z.object({
    reference,
    name: z.string().trim().max(120).optional(),
    geometry: boundary,
    landUse: z
      .string()
      .trim()
      .max(60)
      .optional()
      .describe(`one of: ${Object.keys(EVENT_VALUES['land-use']).join(', ')}`),
    management: z
      .string()
      .trim()
      .max(60)
      .optional()
      .describe(`one of: ${Object.keys(EVENT_VALUES.management).join(', ')}`),
    evidence,
  }),
  response: z.object({
    id: z.number(),
    warnings: z.array(z.string()).describe('overlaps with other parcels within the tolerance'),
  }),
  status: 201,
});

export const editBoundary = defineSpec({
  method: 'PUT',
  path: '/api/parcels/{id}/boundary',
  tag: 'Parcels',
  summary: "Replace a parcel's boundary (validated, area and overlay recomputed, old boundary kept in the audit log)",
  access: ['planner', 'admin'],
  params: idParams,
  body: z.object({
    geometry: boundary,
    version: z.number().int().positive(),
    reason: z.string().trim().min(3, 'Say why the boundary changes.').max(500),
  }),
  response: z.object({
    id: z.number(),
    version: z.number(),
    areaHa: z.number(),
    warnings: z.array(z.string()).describe('overlaps with other parcels within the tolerance'),
  }),
});

export const recordEvent = defineSpec({
  method: 'POST',
  path: '/api/parcels/{id}/events',
  tag: 'Parcels',
  summary:
    'Record a dated land-use, management, tillage or reseeding event with its evidence (date 1900 to today; value valid for the kind)',
  access: ['planner', 'admin'],
  params: idParams,
  body: z.object({
    date: z.iso.date('Use a date in the form YYYY-MM-DD.'),
    kind: z.enum(['land-use', 'management', 'tillage', 'reseeding']),
    value: z
      .string()
      .trim()
      .max(120)
      .optional()
      .describe(
        `Required for land-use and management, optional for tillage and reseeding. ${Object.entries(EVENT_VALUES)
          .map(([k, v]) => `${k}: ${Object.keys(v).join(', ')}`)
          .join('; ')}`,
      ),
    cultivation: z
      .boolean()
      .default(false)
      .describe('marks a management event as cultivation; lime and fertiliser always are'),
    evidence,
  }),
  response: z.object({
    id: z.number(),
    compensationReversedBy: z
      .array(z.number())
      .optional()
      .describe(
        'Register entries that reversed a compensation this event broke (ploughed within its permanence period)',
      ),
  }),
  status: 201,
});

const bbox = z
  .string()
  .transform((s) => s.split(',').map(Number))
  .refine(
    (a) =>
      a.length === 4 &&
      a.every(Number.isFinite) &&
      Math.abs(a[0]!) <= 180 &&
      Math.abs(a[2]!) <= 180 &&
      Math.abs(a[1]!) <= 90 &&
      Math.abs(a[3]!) <= 90,
    'Give bbox as west,south,east,north in degrees.',
  )
  .transform((a) => a as [number, number, number, number]);

export const parcelsForSnapping = defineSpec({
  method: 'GET',
  path: '/api/parcels/boundaries',
  tag: 'Parcels',
  summary: 'Parcel boundaries (id, reference) in a small lon/lat box, for snapping while drawing',
  access: ['planner', 'admin'],
  query: z.object({ bbox }),
  response: z.object({ type: z.literal('FeatureCollection'), features: z.array(z.record(z.string(), z.unknown())) }),
});

export const uploadOnMap = defineSpec({
  method: 'GET',
  path: '/api/map/uploads/{id}',
  tag: 'Map',
  summary: 'The parcels an upload saved (id, reference, outline; at most 2,000), to outline and list them on the map',
  access: 'signed-in',
  params: z.object({ id: z.uuid('Upload ids are UUIDs.') }),
  response: z.object({
    id: z.string(),
    label: z.string(),
    count: z.number().int().describe('Parcels of the upload still in the register; more than listed when above 2,000'),
    parcels: z.array(z.object({ id: z.number(), reference: z.string(), geometry: z.record(z.string(), z.unknown()) })),
  }),
});

export const mapConfig = defineSpec({
  method: 'GET',
  path: '/api/map',
  tag: 'Map',
  summary:
    'Map set-up: data version and tile token (for tile URLs), where the parcels are (per upload), legend of the current reference layers, optional basemap URL',
  access: 'signed-in',
  response: z.object({
    dataVersion: z.number(),
    tileToken: z.string(),
    areas: z.array(
      z.object({
        id: z.string().nullable().describe('Upload id; null for parcels drawn on the map'),
        label: z.string(),
        count: z.number(),
        extent: z.array(z.number()).length(4),
      }),
    ),
    legend: z.array(
      z.object({
        kind: z.string(),
        label: z.string(),
        version: z.number().nullable(),
        classes: z.record(z.string(), z.object({ label: z.string(), colour: z.string(), pattern: z.string() })),
      }),
    ),
    basemapUrl: z.string().nullable(),
    parcelMinZoom: z.number(),
  }),
});

const tileInt = (max: number, what: string) =>
  z
    .string()
    .regex(/^\d{1,7}$/, `${what} must be a whole number.`)
    .transform(Number)
    .refine((n) => n <= max, `${what} is out of range.`);

export const tile = defineSpec({
  method: 'GET',
  path: '/api/tiles/{z}/{x}/{y}.mvt',
  tag: 'Map',
  summary:
    'Vector tile (Mapbox Vector Tile) with layers "parcels" and "reference"; ETag = map data version; signed in by session or by the tile token (?t=)',
  access: 'signed-in',
  params: z.object({ z: tileInt(22, 'Zoom'), x: tileInt(2 ** 22 - 1, 'x'), y: tileInt(2 ** 22 - 1, 'y') }),
  query: z.object({
    v: z.coerce.number().int().nonnegative().optional(),
    t: z
      .string()
      .max(300)
      .optional()
      .describe('Tile token from GET /api/map (tileToken): authorises the tile without a session'),
  }),
  response: null,
  responseType: 'application/vnd.mapbox-vector-tile',
});

export const listReferenceLayers = defineSpec({
  method: 'GET',
  path: '/api/reference-layers',
  tag: 'Map',
  summary: 'Reference layers by kind with all their versions (published versions stay for old assessments)',
  access: 'signed-in',
  response: z.object({ kinds: z.array(z.record(z.string(), z.unknown())) }),
});

export const publishReferenceLayer = defineSpec({
  method: 'POST',
  path: '/api/reference-layers/{id}/publish',
  tag: 'Map',
  summary: 'Publish a draft reference-layer version; every parcel is overlaid with it',
  access: ['admin'],
  params: z.object({ id: z.coerce.number().int().positive() }),
  body: z.object({ note: z.string().trim().max(500).optional() }),
  response: z.object({
    id: z.number(),
    kind: z.string(),
    version: z.number(),
    timings: z.object({ overlayMs: z.number() }),
  }),
});

export const searchParcels = defineSpec({
  method: 'GET',
  path: '/api/parcels/search',
  tag: 'Parcels',
  summary: 'Find parcels by reference or field name (for keyboard users of the map)',
  access: 'signed-in',
  query: z.object({ q: z.string().trim().min(1, 'Type part of a reference or name.').max(60) }),
  response: z.object({
    items: z.array(
      z.object({ id: z.number(), reference: z.string(), name: z.string().nullable(), areaHa: z.number() }),
    ),
  }),
});
