/** Contracts of the territory setting: where the authority's parcels may lie (uploads and drawings are checked against it). */
import { z } from 'zod';
import { defineSpec } from '../http/spec';

const position = z.array(z.number()).min(2).max(3);
const ring = z.array(position).min(4).max(200_000);
const territoryGeometry = z.union([
  z.object({ type: z.literal('Polygon'), coordinates: z.array(ring).min(1).max(1000) }),
  z.object({ type: z.literal('MultiPolygon'), coordinates: z.array(z.array(ring).min(1).max(1000)).min(1).max(1000) }),
]);

const territoryAnswer = z.object({
  territory: z
    .record(z.string(), z.unknown())
    .nullable()
    .describe('MultiPolygon in WGS 84 (EPSG:4326), or null when nothing is checked'),
  source: z
    .enum(['setting', 'reference-layers', 'none'])
    .describe(
      'setting: stored by an administrator; reference-layers: the default, the current reference layers widened by defaultMarginDeg; none: no check',
    ),
  defaultMarginDeg: z.number(),
});

export const getTerritory = defineSpec({
  method: 'GET',
  path: '/api/settings/territory',
  tag: 'Settings',
  summary:
    "The authority's territory that uploads and drawn parcels must lie in (the stored setting, else the reference layers plus a margin)",
  access: 'signed-in',
  response: territoryAnswer,
});

export const putTerritory = defineSpec({
  method: 'PUT',
  path: '/api/settings/territory',
  tag: 'Settings',
  summary: 'Set the territory: a GeoJSON Polygon or MultiPolygon in WGS 84, or null for no territory check (audited)',
  access: ['admin'],
  body: z.object({ territory: territoryGeometry.nullable() }),
  response: territoryAnswer,
});
