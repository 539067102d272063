/** The validation report as a CSV download: every feature in file order, statuses and problems in words, measured areas even for rejected boundaries. */
import { parse } from 'csv-parse/sync';
import { afterAll, describe, expect, it } from 'vitest';
import { testDb } from '../support/db';
import { api, DEMO, signIn } from '../support/http';
import { rect } from '../support/proposals';
import { uploadFile } from '../support/uploads';

afterAll(async () => {
  await testDb.destroy();
});

describe('upload report as CSV', () => {
  it('lists every feature with its status, measured area and remarks in words; only for the uploader or an admin, and only once checked', async () => {
    const planner = await signIn(DEMO.planner);
    // Far south of the demo grid (y −5000 m), so nothing overlaps the register.
    const square = rect([0, -5000, 100, -4900]);
    const c = (x: number, y: number) => rect([x, y, x, y]).coordinates[0]![0]!;
    // A bow-tie: its boundary crosses itself (rejected, or repaired into two parts).
    const bowTie = {
      type: 'Polygon',
      coordinates: [[c(200, -5000), c(300, -4900), c(300, -5000), c(200, -4900), c(200, -5000)]],
    };
    const file = JSON.stringify({
      type: 'FeatureCollection',
      features: [
        { type: 'Feature', properties: { ref: 'RPT-1', area: 1 }, geometry: square },
        { type: 'Feature', properties: { ref: 'RPT-2', area: 1 }, geometry: bowTie },
        { type: 'Feature', properties: { ref: 'RPT-1', area: 1 }, geometry: rect([400, -5000, 500, -4900]) },
      ],
    });
    const staged = await uploadFile(planner, 'report-check.geojson', file);
    expect(staged.status).toBe(201);
    const early = await api('GET', `/api/uploads/${staged.body.id}/report.csv`, { session: planner });
    expect(early.status).toBe(409);
    const report = await api('POST', `/api/uploads/${staged.body.id}/validation`, {
      session: planner,
      body: { layer: staged.body.layers[0].name, mapping: { reference: 'ref', statedArea: 'area' } },
    });
    expect(report.status).toBe(200);

    const csv = await api('GET', `/api/uploads/${staged.body.id}/report.csv`, { session: planner });
    expect(csv.status).toBe(200);
    expect(csv.headers.get('content-type')).toMatch(/^text\/csv/);
    expect(csv.headers.get('content-disposition')).toContain('report-check-report.csv');
    const rows = parse(csv.body as string, { columns: true }) as Record<string, string>[];
    expect(rows.map((r) => r.row)).toEqual(['1', '2', '3']);
    expect(rows.map((r) => r.reference)).toEqual(['RPT-1', 'RPT-2', 'RPT-1']);
    // 100 m × 100 m = 1 ha on the ground (UTM metres; ellipsoidal area within 1 %, common practice).
    expect(Number(rows[0]!.measured_area_ha)).toBeCloseTo(1, 1);
    for (const r of rows) expect(r.measured_area_ha).not.toBe('');
    expect(rows[1]!.found).toContain('boundary that crosses itself');
    expect(rows[2]!.status).toBe('Rejected, not saved');
    expect(rows[2]!.found).toContain('reference repeated in the file');
    for (const r of rows) expect(r.found).not.toMatch(/[a-z]+-[a-z]+-[a-z]+/);
    // The counts in words on the report page come from the same list.
    expect(Object.keys(report.body.summary.byCode)).toEqual(
      expect.arrayContaining(['self-intersection', 'duplicate-reference']),
    );

    const assessor = await signIn(DEMO.assessor);
    expect((await api('GET', `/api/uploads/${staged.body.id}/report.csv`, { session: assessor })).status).toBe(403);
    const admin = await signIn(DEMO.admin);
    expect((await api('GET', `/api/uploads/${staged.body.id}/report.csv`, { session: admin })).status).toBe(200);
    await api('DELETE', `/api/uploads/${staged.body.id}`, { session: planner });
  });
});
