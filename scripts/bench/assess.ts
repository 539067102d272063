/**
 * Issue 7's figures: a 2,000-parcel proposal assessed with 1,000 joint Monte Carlo runs (server
 * time and its phases from the Server-Timing header), and the screening map recomputed over every
 * parcel. The bench parcels' files carry today's land use only, so each grassland parcel is first
 * given a recorded land use of 2010 (as a history upload would; once per batch), which makes it
 * permanent grassland.
 */
import knexFactory from 'knex';
import { randomUUID } from 'node:crypto';
import { BASE, call, logged, s, serverCpuMs, skipped } from './server';

const HISTORY = 'Benchmark history';

async function benchParcels(batchId: string): Promise<number[]> {
  const knex = knexFactory({ client: 'pg', connection: process.env.DATABASE_URL });
  try {
    const done = await knex('land_use_event').where({ batch_id: batchId, evidence: HISTORY }).first();
    if (!done) {
      await knex.raw(
        `insert into land_use_event (parcel_id, event_date, kind, value, evidence, batch_id)
                      select id, date '2010-04-01', 'land-use', land_use, ?, batch_id from parcel where batch_id = ` +
          `? and land_use in ('grassland', 'meadow', 'pasture')`,
        [HISTORY, batchId],
      );
      await knex.raw('analyze land_use_event');
    }
    return (
      await knex('parcel').where({ batch_id: batchId, land_use: 'grassland' }).orderBy('id').limit(2000).select('id')
    ).map((r) => Number(r.id));
  } finally {
    await knex.destroy();
  }
}

/** "a;dur=1, b;dur=2" → "a 1 ms, b 2 ms" */
const phases = (h: string | null) =>
  (h ?? '')
    .split(',')
    .map((p) => {
      const [name, ...rest] = p.trim().split(';');
      const d = rest.find((x) => x.startsWith('dur='));
      return `${name} ${d ? Number(d.slice(4)).toFixed(0) : '?'} ms`;
    })
    .join(', ');

async function assess(planner: string, assessor: string, ids: number[]): Promise<void> {
  const created = await call<{ id: number; version: number }>(planner, 'POST', '/api/proposals', {
    title: 'Benchmark block',
    description: 'Two thousand parcels converted at once.',
    startYear: 2027,
    parcels: ids.map((parcelId) => ({ parcelId })),
    proposed: { landUse: 'cropland', system: 'long-term-cultivated', tillage: 'full', input: 'medium' },
    applicant: { name: 'Bench Applicant', contact: 'bench@bench.example', interest: 'owner' },
  });
  await call(planner, 'POST', `/api/proposals/${created.data.id}/transitions`, {
    to: 'submitted',
    version: created.data.version,
  });
  for (const run of ['first run', 're-run']) {
    const t0 = performance.now();
    const cpu0 = serverCpuMs();
    const reqId = randomUUID();
    // As a browser asks (gzip, deflate: what fetch sends over http), so the server compresses as it would for one.
    const r = await fetch(`${BASE}/api/proposals/${created.data.id}/assessment`, {
      method: 'POST',
      headers: { cookie: assessor, origin: BASE, 'content-type': 'application/json', 'x-request-id': reqId },
      body: '{}',
    });
    const body = await r.text();
    if (!r.ok) throw new Error(`assessment: ${r.status} ${body.slice(0, 300)}`);
    const wall = performance.now() - t0;
    const timing = r.headers.get('server-timing');
    const computed = Number(/(?:^|,\s*)assess;dur=([\d.]+)/.exec(timing ?? '')?.[1]);
    const server = await logged(reqId);
    const cpu = serverCpuMs() - cpu0;
    const a = JSON.parse(body) as { totals: { runs: number; co2eTotal: number } };
    console.log(
      `\nassessment of a ${ids.length}-parcel proposal (${run}), ${a.totals.runs} joint Monte Carlo runs: ` +
        `server ${s(server)} from arrival to the last byte written (aim: < 1 s; ${r.headers.get('content-encoding') ?? 'not'} ` +
        `compressed), answer made in ${s(computed)}, request ${s(wall)} with a ${(body.length / 1e6).toFixed(1)} MB answer`,
    );
    console.log(`  server phases: ${phases(timing)}; server process CPU time ${s(cpu)}`);
  }
}

export async function assessAndScreen(
  planner: string,
  assessor: string,
  batchId: string,
  count: number,
): Promise<void> {
  const ids = await benchParcels(batchId);
  if (!skipped('assess')) await assess(planner, assessor, ids);
  if (skipped('screening')) return;
  const screening = await call<{ screened: number; ms: number }>(assessor, 'POST', '/api/screening/recompute');
  console.log(
    `screening map recomputed over ${count} parcels (${screening.data.screened} permanent ` +
      `grassland): ${s(screening.data.ms)} computing (aim: < 5 s), request ${s(screening.ms)}`,
  );
  const timing = screening.headers.get('server-timing');
  if (timing) console.log(`  server phases: ${phases(timing)}`);
}
