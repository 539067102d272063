/**
 * Validation runs off the request thread (worker pool): while a 100,000-vertex polygon is
 * uploaded and validated, /api/health keeps answering. Only "answered" is asserted here; the
 * 300,000-vertex case and its response-time figure (p99 under 200 ms) are `npm run bench`'s.
 */
import type { Position } from 'geojson';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { fromWgs84, toWgs84 } from '~/lib/gis/crs';
import { crsFromEpsg } from '~/lib/gis/crs-catalogue.server';
import { CORROWMERE } from '../../gis/lib/regions';
import { testDb } from '../support/db';
import { BASE_URL } from '../support/env';
import { api, DEMO, signIn, type Session } from '../support/http';
import { uploadFile } from '../support/uploads';

let planner: Session;
beforeAll(async () => {
  planner = await signIn(DEMO.planner);
});
afterAll(() => testDb.destroy());

describe('a huge validation does not block other requests', () => {
  it('answers /api/health throughout', async () => {
    const utm = await crsFromEpsg(32628);
    const [x0, y0] = fromWgs84(CORROWMERE.originLonLat, utm).map((n) => Math.round(n));
    const n = 100_000;
    const ring: Position[] = [];
    // A circle of 300 m radius west of the demo fields (x -600 m, y 2500 m from the grid origin).
    for (let i = 0; i < n; i++)
      ring.push(
        toWgs84(
          [x0! - 600 + 300 * Math.cos((2 * Math.PI * i) / n), y0! + 2500 + 300 * Math.sin((2 * Math.PI * i) / n)],
          utm,
        ),
      );
    ring.push(ring[0]!);
    const file = JSON.stringify({
      type: 'FeatureCollection',
      features: [
        { type: 'Feature', properties: { ref: 'HUGE-1' }, geometry: { type: 'Polygon', coordinates: [ring] } },
      ],
    });

    const answers: { status: number; during: boolean }[] = [];
    let validating = false;
    let running = true;
    const poll = (async () => {
      while (running) {
        const during = validating;
        const res = await fetch(`${BASE_URL}/api/health`);
        await res.text();
        answers.push({ status: res.status, during: during && validating });
        await new Promise((r) => setTimeout(r, 25));
      }
    })();
    const staged = await uploadFile(planner, 'huge.geojson', file);
    expect(staged.status).toBe(201);
    validating = true;
    const report = await api('POST', `/api/uploads/${staged.body.id}/validation`, {
      session: planner,
      body: { layer: staged.body.layers[0].name, mapping: { reference: 'ref' } },
    });
    validating = false;
    running = false;
    await poll;
    expect(report.status).toBe(200);
    expect(report.body.summary).toMatchObject({ total: 1, rejected: 0 });
    expect(answers.every((a) => a.status === 200)).toBe(true);
    expect(answers.filter((a) => a.during).length).toBeGreaterThan(0);
    await api('DELETE', `/api/uploads/${staged.body.id}`, { session: planner });
  }, 180_000);
});
