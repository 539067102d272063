/**
 * The authority's territory: its default (the demo reference layers plus a margin), the admin
 * setting GET/PUT /api/settings/territory (audited), parcels outside it refused on upload and
 * drawing, and swapped axes named as such.
 */
import type { Position } from 'geojson';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { fromWgs84, toWgs84 } from '~/lib/gis/crs';
import { crsFromEpsg } from '~/lib/gis/crs-catalogue.server';
import { CORROWMERE } from '../../gis/lib/regions';
import { testDb } from '../support/db';
import { api, DEMO, signIn, type Session } from '../support/http';
import { uploadFile } from '../support/uploads';

let planner: Session;
let admin: Session;
let origin: Position;
const utm = await crsFromEpsg(32628);
beforeAll(async () => {
  planner = await signIn(DEMO.planner);
  admin = await signIn(DEMO.admin);
  origin = fromWgs84(CORROWMERE.originLonLat, utm).map((n) => Math.round(n));
});
afterAll(async () => {
  await testDb('app_setting').where({ key: 'territory' }).delete();
  await testDb.destroy();
});

/** A box in metres from the demo grid origin as a lon/lat ring; `swap` writes latitude first. */
function ring([x0, y0, x1, y1]: [number, number, number, number], swap = false) {
  return [
    [x0, y0],
    [x1, y0],
    [x1, y1],
    [x0, y1],
    [x0, y0],
  ].map(([x, y]) => {
    const [lon, lat] = toWgs84([origin[0]! + x!, origin[1]! + y!], utm);
    return swap ? [lat!, lon!] : [lon!, lat!];
  });
}
const fc = (features: { ref: string; coordinates: number[][] }[]) =>
  JSON.stringify({
    type: 'FeatureCollection',
    features: features.map((f) => ({
      type: 'Feature',
      properties: { ref: f.ref },
      geometry: { type: 'Polygon', coordinates: [f.coordinates] },
    })),
  });

async function validate(file: string, text: string) {
  const staged = await uploadFile(planner, file, text);
  const report = await api('POST', `/api/uploads/${staged.body.id}/validation`, {
    session: planner,
    body: { layer: staged.body.layers[0].name, mapping: { reference: 'ref' } },
  });
  expect(report.status).toBe(200);
  await api('DELETE', `/api/uploads/${staged.body.id}`, { session: planner });
  return report.body;
}
const codeOf = (report: any, ref: string) =>
  report.features
    .find((f: { reference: string }) => f.reference === ref)
    ?.issues.map((i: { code: string }) => i.code) ?? [];

describe('territory', () => {
  it('defaults to the current reference layers plus a margin', async () => {
    const t = await api('GET', '/api/settings/territory', { session: planner });
    expect(t.status).toBe(200);
    expect(t.body).toMatchObject({
      source: 'reference-layers',
      defaultMarginDeg: 0.05,
      territory: { type: 'MultiPolygon' },
    });
  });

  it('refuses parcels outside it, and says when the axes look swapped', async () => {
    const far = [
      [10, 45],
      [10.001, 45],
      [10.001, 45.001],
      [10, 45],
    ];
    const report = await validate(
      'outside.geojson',
      fc([
        { ref: 'TT-IN', coordinates: ring([-900, 3900, -800, 4000]) },
        { ref: 'TT-SWAP', coordinates: ring([-700, 3900, -600, 4000], true) },
        { ref: 'TT-FAR', coordinates: far },
      ]),
    );
    expect(codeOf(report, 'TT-IN')).toEqual([]);
    // Swapping the axes also mirrors the ring, so its orientation is repaired as well.
    expect(codeOf(report, 'TT-SWAP')).toEqual(['ring-orientation', 'axes-swapped']);
    const swap = report.features.find((f: { reference: string }) => f.reference === 'TT-SWAP');
    expect(swap.issues[1].message).toMatch(
      /^Feature 2 \(TT-SWAP\) lies outside the authority's territory, but with longitude and latitude swapped it lies inside: the axes look swapped/,
    );
    expect(codeOf(report, 'TT-FAR')).toEqual(['outside-territory']);
    expect(report.summary).toMatchObject({ total: 3, rejected: 2 });
    const drawn = await api('POST', '/api/parcels', {
      session: planner,
      body: { reference: 'TT-DRAWN', geometry: { type: 'Polygon', coordinates: [far] }, evidence: 'territory test' },
    });
    expect(drawn.status).toBe(422);
    expect(drawn.body.error.message).toMatch(/^The boundary lies outside the authority's territory/);
  });

  it('is an admin setting: set, audited, checked, and null for no check', async () => {
    const box = {
      type: 'Polygon',
      coordinates: [
        [
          [-16.5, 52],
          [-15.5, 52],
          [-15.5, 52.8],
          [-16.5, 52.8],
          [-16.5, 52],
        ],
      ],
    };
    expect((await api('PUT', '/api/settings/territory', { session: planner, body: { territory: box } })).status).toBe(
      403,
    );
    const bowtie = {
      type: 'Polygon',
      coordinates: [
        [
          [-16.5, 52],
          [-15.5, 52.8],
          [-15.5, 52],
          [-16.5, 52.8],
          [-16.5, 52],
        ],
      ],
    };
    const bad = await api('PUT', '/api/settings/territory', { session: admin, body: { territory: bowtie } });
    expect(bad.status).toBe(422);
    expect(bad.body.error.message).toMatch(
      /^The territory is not a valid polygon: The boundary crosses or touches itself/,
    );
    const set = await api('PUT', '/api/settings/territory', { session: admin, body: { territory: box } });
    expect(set.status).toBe(200);
    expect(set.body).toMatchObject({
      source: 'setting',
      territory: { type: 'MultiPolygon', coordinates: [box.coordinates] },
    });
    const audit = await testDb('audit_event').where({ action: 'settings.territory' }).orderBy('id', 'desc').first();
    expect(audit.details.after).toEqual(box);
    // Velomari (96.3° E) is outside the box now.
    const velomari = [
      [96.3, -7.8],
      [96.301, -7.8],
      [96.301, -7.799],
      [96.3, -7.8],
    ];
    expect(
      codeOf(await validate('velomari-out.geojson', fc([{ ref: 'TT-VM', coordinates: velomari }])), 'TT-VM'),
    ).toEqual(['outside-territory']);
    const none = await api('PUT', '/api/settings/territory', { session: admin, body: { territory: null } });
    expect(none.body).toMatchObject({ source: 'none', territory: null });
    expect(
      codeOf(
        await validate(
          'anywhere.geojson',
          fc([
            {
              ref: 'TT-ANY',
              coordinates: [
                [10, 45],
                [10.001, 45],
                [10.001, 45.001],
                [10, 45],
              ],
            },
          ]),
        ),
        'TT-ANY',
      ),
    ).toEqual([]);
    expect((await api('PUT', '/api/settings/territory', { session: admin, body: {} })).status).toBe(422);
  });
});
