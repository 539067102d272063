/**
 * Register integrity through the real upload and drawing routes: overlaps and near-duplicates
 * (in one file, with the register, shifted, GeoJSON vs shapefile, slivers along shared edges),
 * land-use values on every path, "in grass since" at upload, and concurrent saves of conflicting
 * parcels, of which exactly one may land. Test parcels lie north-west of the demo fields (which
 * cover x 0–5200 m, y 0–3150 m from the grid origin, gis/lib/regions.ts), inside the demo layers.
 */
import type { Position } from 'geojson';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { fromWgs84, toWgs84 } from '~/lib/gis/crs';
import { crsFromEpsg } from '~/lib/gis/crs-catalogue.server';
import { writePolygonShapefile } from '~/lib/gis/export/shapefile-writer';
import { CORROWMERE } from '../../gis/lib/regions';
import { FIELDS, layerEntries, UTM28_WKT, zipOf } from '../unit/gis/shapefile-fixtures';
import { testDb } from '../support/db';
import { api, DEMO, signIn, type Session } from '../support/http';
import { uploadFile } from '../support/uploads';

let planner: Session;
let origin: Position;
const utm = await crsFromEpsg(32628);
beforeAll(async () => {
  planner = await signIn(DEMO.planner);
  origin = fromWgs84(CORROWMERE.originLonLat, utm).map((n) => Math.round(n));
});
afterAll(() => testDb.destroy());

type Box = [number, number, number, number];
/** Corners of a box in UTM metres from the demo grid origin. */
const utmRing = ([x0, y0, x1, y1]: Box) =>
  [
    [x0, y0],
    [x1, y0],
    [x1, y1],
    [x0, y1],
    [x0, y0],
  ].map(([x, y]) => [origin[0]! + x!, origin[1]! + y!]);
/** The box as a lon/lat Polygon; `digits` rounds like a GIS export would. */
function rect(box: Box, digits?: number) {
  const ring = utmRing(box).map((p) =>
    toWgs84(p, utm).map((v) => (digits === undefined ? v : Number(v.toFixed(digits)))),
  );
  return { type: 'Polygon' as const, coordinates: [ring] };
}
function geojson(features: { ref: string; box: Box; digits?: number; props?: Record<string, unknown> }[]): string {
  return JSON.stringify({
    type: 'FeatureCollection',
    features: features.map((f) => ({
      type: 'Feature',
      properties: { ref: f.ref, ...f.props },
      geometry: rect(f.box, f.digits),
    })),
  });
}

async function validate(
  file: string,
  bytes: string | Uint8Array,
  mapping: Record<string, unknown> = { reference: 'ref' },
) {
  const staged = await uploadFile(planner, file, bytes);
  expect(staged.status).toBe(201);
  const report = await api('POST', `/api/uploads/${staged.body.id}/validation`, {
    session: planner,
    body: { layer: staged.body.layers[0].name, mapping },
  });
  expect(report.status).toBe(200);
  return { id: staged.body.id as string, report: report.body };
}
const issuesOf = (report: any, ref: string) =>
  report.features.find((f: { reference: string }) => f.reference === ref)?.issues ?? [];
const save = (id: string) => api('POST', `/api/uploads/${id}/save`, { session: planner });

describe('overlaps and near-duplicates', () => {
  it('refuses a parcel covering 48 % of another in the same file, naming both and the overlap', async () => {
    // A: 100 m × 100 m. B: 100 m × 100 m shifted 52 m east, so 48 m × 100 m = 4800 m² overlap (48 %).
    const { report } = await validate(
      'same-file.geojson',
      geojson([
        { ref: 'OV-A', box: [-900, 3500, -800, 3600] },
        { ref: 'OV-B', box: [-848, 3500, -748, 3600] },
      ]),
    );
    expect(report.summary).toMatchObject({ total: 2, rejected: 1 });
    const [issue] = issuesOf(report, 'OV-B');
    expect(issue.code).toBe('overlap');
    // Grid metres vs ellipsoid: areas scale by 1/k² ≈ 1.0007 here (UTM point scale, from memory), so 4800 m² reads as about 4803 m².
    expect(issue.message).toMatch(
      /^Feature 2 \(OV-B\) overlaps feature 1 \(OV-A\) by 480\d\.\d m² \(48\.0 % of the smaller parcel\), more than the tolerance/,
    );
  });

  it('refuses an overlap with the register, and the same parcel shifted by 15 m', async () => {
    const first = await validate('register-a.geojson', geojson([{ ref: 'OV-R1', box: [-700, 3500, -600, 3600] }]));
    expect((await save(first.id)).status).toBe(201);
    const { report } = await validate(
      'register-b.geojson',
      geojson([
        { ref: 'OV-R2', box: [-648, 3500, -548, 3600] },
        { ref: 'OV-R3', box: [-685, 3500, -585, 3600] },
      ]),
    );
    expect(issuesOf(report, 'OV-R2')[0].message).toMatch(
      /^Feature 1 \(OV-R2\) overlaps parcel OV-R1 in the register by 480\d\.\d m² \(48\.0 %/,
    );
    // 15 m shift: 85 m × 100 m overlap, 85 % of either parcel.
    expect(issuesOf(report, 'OV-R3')[0]).toMatchObject({
      code: 'overlap',
      severity: 'error',
      message: expect.stringMatching(/overlaps parcel OV-R1 in the register by 850\d\.\d m² \(85\.0 %/),
    });
    expect(report.summary.rejected).toBe(2);
  });

  it('recognises the same parcels sent as GeoJSON and then as a shapefile as duplicates', async () => {
    // GeoJSON written to 6 decimals (about 0.1 m), as exports often are; the shapefile keeps the UTM metres.
    const gj = await validate(
      'twins.geojson',
      geojson([
        { ref: 'TW-1', box: [-500, 3500, -400, 3600], digits: 6 },
        { ref: 'TW-2', box: [-400, 3500, -300, 3600], digits: 6 },
      ]),
    );
    expect(gj.report.summary).toMatchObject({ total: 2, rejected: 0 });
    expect((await save(gj.id)).status).toBe(201);
    const shp = writePolygonShapefile(
      [
        {
          geometry: { type: 'Polygon', coordinates: [utmRing([-500, 3500, -400, 3600])] },
          properties: { field_ref: 'TW-1-SHP', name: 'a', stated_ha: null, last_till: null },
        },
        {
          geometry: { type: 'Polygon', coordinates: [utmRing([-400, 3500, -300, 3600])] },
          properties: { field_ref: 'TW-2-SHP', name: 'b', stated_ha: null, last_till: null },
        },
      ],
      { fields: FIELDS, prjWkt: UTM28_WKT },
    );
    const { report } = await validate('twins.zip', zipOf(layerEntries('twins', shp)), { reference: 'field_ref' });
    expect(report.summary.rejected).toBe(2);
    expect(issuesOf(report, 'TW-1-SHP')[0]).toMatchObject({
      code: 'near-duplicate',
      message: expect.stringMatching(
        /^Feature 1 \(TW-1-SHP\) is almost the same boundary as parcel TW-1 in the register: they differ by \d+\.\d m² \(0\.\d\d %/,
      ),
    });
  });

  it('lets slivers along a shared edge through with a warning, not an error', async () => {
    // Neighbours digitised 0.5 m into each other along a 100 m edge: 50 m², 0.5 % of either.
    const { id, report } = await validate(
      'slivers.geojson',
      geojson([
        { ref: 'SL-1', box: [-200, 3500, -100, 3600] },
        { ref: 'SL-2', box: [-100.5, 3500, -0.5, 3600] },
      ]),
    );
    expect(report.summary).toMatchObject({ total: 2, rejected: 0 });
    expect(issuesOf(report, 'SL-2')).toEqual([
      expect.objectContaining({
        code: 'overlap-minor',
        severity: 'warning',
        message: expect.stringMatching(
          /overlaps feature 1 \(SL-1\) by 50\.\d m² \(0\.50 % of the smaller parcel\); within the tolerance/,
        ),
      }),
    ]);
    expect((await save(id)).body.saved).toBe(2);
  });

  it('applies the same rules to drawn and edited boundaries', async () => {
    const drawn = await api('POST', '/api/parcels', {
      session: planner,
      body: { reference: 'OV-DRAWN', geometry: rect([-690, 3550, -590, 3650]), evidence: 'integrity test' },
    });
    expect(drawn.status).toBe(409);
    expect(drawn.body.error.message).toMatch(
      /^The boundary overlaps parcel OV-R1 by 4\d{3}\.\d m² \(\d\d\.\d % of the smaller parcel\)/,
    );
    const ok = await api('POST', '/api/parcels', {
      session: planner,
      body: { reference: 'OV-DRAWN', geometry: rect([-900, 3700, -800, 3800]), evidence: 'integrity test' },
    });
    expect(ok.status).toBe(201);
    const { version } = (await api('GET', `/api/parcels/${ok.body.id}`, { session: planner })).body;
    const edit = await api('PUT', `/api/parcels/${ok.body.id}/boundary`, {
      session: planner,
      body: { geometry: rect([-700, 3520, -600, 3620]), version, reason: 'moved onto a neighbour' },
    });
    expect(edit.status).toBe(409);
    expect(edit.body.error.message).toMatch(/overlaps parcel OV-R1/);
  });
});

describe('land use is checked on every path, and history can be mapped at upload', () => {
  it('refuses land-use and management values that the events route would refuse', async () => {
    const drawn = await api('POST', '/api/parcels', {
      session: planner,
      body: {
        reference: 'LU-1',
        geometry: rect([0, 3700, 100, 3800]),
        landUse: 'grass-ish',
        evidence: 'integrity test',
      },
    });
    expect(drawn.status).toBe(422);
    expect(drawn.body.error.message).toMatch(
      /^Invalid body \(landUse\): "grass-ish" is not on the list; choose one of: grassland, /,
    );
    const { report } = await validate(
      'land-use.geojson',
      geojson([{ ref: 'LU-2', box: [0, 3700, 100, 3800], props: { use: 'Pasture', man: 'mowed sometimes' } }]),
      { reference: 'ref', landUse: 'use', management: 'man' },
    );
    expect(issuesOf(report, 'LU-2').map((i: { code: string }) => i.code)).toEqual(['bad-management']);
  });

  it('records "in grass since" and one tillage date for the file as dated events, so the flags are known at once', async () => {
    const { id } = await validate(
      'grass-since.geojson',
      geojson([{ ref: 'GS-1', box: [100, 3700, 200, 3800], props: { use: 'Pasture', since: '2009-04-01' } }]),
      { reference: 'ref', landUse: 'use', grassSince: 'since', lastTillageDate: '2008-09-15' },
    );
    expect((await save(id)).status).toBe(201);
    const p = await testDb('parcel').where({ reference: 'GS-1' }).first();
    const detail = (await api('GET', `/api/parcels/${p.id}`, { session: planner })).body;
    expect(
      detail.history.map((e: { date: string; kind: string; value: string | null }) => [e.date, e.kind, e.value]),
    ).toEqual([
      ['2008-09-15', 'tillage', null],
      ['2009-04-01', 'land-use', 'grassland'],
      [expect.any(String), 'land-use', 'pasture'],
    ]);
    expect(detail.history[1].evidence).toMatch(/^Upload "grass-since\.geojson"/);
    expect(detail.flags.permanentGrassland.value).toBe(true);
  });
});

describe('concurrent saves of conflicting parcels: exactly one lands', () => {
  async function race(a: { ref: string; box: Box }, b: { ref: string; box: Box }) {
    const first = await validate(`race-${a.ref}.geojson`, geojson([a]));
    const second = await validate(`race-${b.ref}-2.geojson`, geojson([b]));
    expect([first.report.summary.rejected, second.report.summary.rejected]).toEqual([0, 0]);
    const results = await Promise.all([save(first.id), save(second.id)]);
    expect(results.map((r) => r.status).sort()).toEqual([201, 409]);
    return results.find((r) => r.status === 409)!.body.error.message as string;
  }

  it('the same boundary under two references', async () => {
    const message = await race(
      { ref: 'RACE-GEOM-1', box: [300, 3700, 400, 3800] },
      { ref: 'RACE-GEOM-2', box: [300, 3700, 400, 3800] },
    );
    expect(message).toMatch(
      /^Another save changed the register after this upload was validated: feature 1 \(RACE-GEOM-\d\) has the same boundary as parcel RACE-GEOM-\d/,
    );
  });

  it('references that differ only by letter case', async () => {
    await race({ ref: 'RACE-Case', box: [500, 3700, 600, 3800] }, { ref: 'race-case', box: [700, 3700, 800, 3800] });
    expect(await testDb('parcel').whereILike('reference', 'race-case')).toHaveLength(1);
  });

  it('references that differ only by look-alike letters (Cyrillic АВС against Latin ABC), and drawn ones too', async () => {
    const message = await race(
      { ref: 'ABC-7', box: [900, 3700, 1000, 3800] },
      { ref: '\u0410\u0412\u0421-7', box: [1100, 3700, 1200, 3800] },
    );
    expect(message).toMatch(/reference "(ABC-7|\u0410\u0412\u0421-7)" is now taken by parcel/);
    const draw = (reference: string, box: Box) =>
      api('POST', '/api/parcels', {
        session: planner,
        body: { reference, geometry: rect(box), evidence: 'race test' },
      });
    const byCase = await Promise.all([
      draw('RACE-DRAWN', [1300, 3700, 1400, 3800]),
      draw('race-drawn', [1500, 3700, 1600, 3800]),
    ]);
    expect(byCase.map((r) => r.status).sort()).toEqual([201, 409]);
    const byBoundary = await Promise.all([
      draw('RACE-DRAWN-3', [1300, 3900, 1400, 4000]),
      draw('RACE-DRAWN-4', [1300, 3900, 1400, 4000]),
    ]);
    expect(byBoundary.map((r) => r.status).sort()).toEqual([201, 409]);
  });

  it('refuses invisible and text-direction characters in references', async () => {
    const res = await api('POST', '/api/parcels', {
      session: planner,
      body: { reference: 'RACE\u200B-9', geometry: rect([1700, 3700, 1800, 3800]), evidence: 'integrity test' },
    });
    expect(res.status).toBe(422);
    expect(res.body.error.message).toMatch(/invisible or text-direction control character \(U\+200B\)/);
    const { report } = await validate(
      'bidi.geojson',
      geojson([{ ref: 'RACE-\u202E01', box: [1700, 3700, 1800, 3800] }]),
    );
    expect(issuesOf(report, 'RACE-\u202E01')[0].code).toBe('bad-reference');
  });
});
