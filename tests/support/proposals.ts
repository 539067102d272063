/** Filing, submitting and assessing proposals through the running test server. */
import type { Position } from 'geojson';
import { toWgs84 } from '~/lib/gis/crs';
import { crsFromEpsg } from '~/lib/gis/crs-catalogue.server';
import { CORROWMERE } from '../../gis/lib/regions';
import { testDb } from './db';
import { api, type Session } from './http';

const utm = await crsFromEpsg(CORROWMERE.epsg);
const origin = (await import('~/lib/gis/crs')).fromWgs84(CORROWMERE.originLonLat as Position, utm);

/** A rectangle [x0, y0, x1, y1] in metres from the Corrowmere grid origin (UTM 28N, gis/lib/regions.ts), as a lon/lat Polygon. */
export function rect([x0, y0, x1, y1]: [number, number, number, number]) {
  const c = [
    [x0, y0],
    [x1, y0],
    [x1, y1],
    [x0, y1],
    [x0, y0],
  ].map(([x, y]) => toWgs84([origin[0]! + x!, origin[1]! + y!], utm));
  return { type: 'Polygon' as const, coordinates: [c] };
}

export const CROPLAND = {
  landUse: 'cropland',
  system: 'long-term-cultivated',
  tillage: 'full',
  input: 'medium',
} as const;
export const APPLICANT = {
  name: 'Orla Test-Applicant',
  contact: 'orla.applicant@fields.example',
  interest: 'owner',
} as const;

/**
 * A free square of ground for a test parcel: slots of 160 m east of the demo parcel grid
 * (x 5300-6100 m, y 0-2560 m: cool temperate moist, HAC soil, Fenbrook district), numbered by
 * the test parcels already in the database so that files running one after another never overlap.
 */
export async function freeBox(sizeM = 100): Promise<[number, number, number, number]> {
  next ??= Number((await testDb('parcel').where('reference', 'like', 'T-%').count('* as n').first())?.n ?? 0);
  const used = next++;
  const [col, row] = [used % 5, Math.floor(used / 5)];
  if (row >= 16) throw new Error('no free test ground left; widen freeBox');
  const [x, y] = [5300 + col * 160, row * 160];
  return [x, y, x + sizeM, y + sizeM];
}
let next: number | undefined;

let counter = 0;
/** Draws a parcel in free ground of the demo region (no demo parcel there) and returns its id. */
export async function drawParcel(
  planner: Session,
  box?: [number, number, number, number],
  landUse = 'grassland',
): Promise<number> {
  const geometry = rect(box ?? (await freeBox()));
  const res = await api('POST', '/api/parcels', {
    session: planner,
    body: {
      reference: `T-${Date.now()}-${++counter}`,
      geometry,
      landUse,
      management: landUse === 'arable' ? 'cropped' : 'grazed',
      evidence: 'test parcel',
    },
  });
  if (res.status !== 201) throw new Error(`draw parcel: ${res.status} ${JSON.stringify(res.body)}`);
  return res.body.id;
}

export async function fileProposal(
  planner: Session,
  parcels: { parcelId: number; part?: unknown }[],
  extra: Record<string, unknown> = {},
) {
  const res = await api('POST', '/api/proposals', {
    session: planner,
    body: {
      title: 'Plough for spring barley',
      description: 'Convert the grass field to arable rotation.',
      startYear: 2027,
      parcels,
      proposed: CROPLAND,
      applicant: APPLICANT,
      ...extra,
    },
  });
  if (res.status !== 201) throw new Error(`file proposal: ${res.status} ${JSON.stringify(res.body)}`);
  return res.body as { id: number; reference: string; version: number };
}

export async function submit(planner: Session, id: number) {
  const p = (await api('GET', `/api/proposals/${id}`, { session: planner })).body;
  const res = await api('POST', `/api/proposals/${id}/transitions`, {
    session: planner,
    body: { to: 'submitted', version: p.version },
  });
  if (res.status !== 200) throw new Error(`submit: ${res.status} ${JSON.stringify(res.body)}`);
  return res.body;
}

export async function assess(assessor: Session, id: number, body: Record<string, unknown> = {}) {
  return api('POST', `/api/proposals/${id}/assessment`, { session: assessor, body });
}

/** The admin setting that allows signing off while factor tables are unconfirmed (the shipped sets have unconfirmed tables). */
export async function allowSignOff(): Promise<void> {
  await testDb('app_setting')
    .insert({ key: 'assessment.allow-unconfirmed-sign-off', value: JSON.stringify(true) })
    .onConflict('key')
    .merge();
}
