/**
 * Issue 8's figures for the public register at BENCH_REGISTER_ENTRIES entries (default 100,000):
 *  1. fills the register up to that many chained entries (register-entries.ts; kept between runs);
 *  2. GET /api/register with 50 concurrent clients (autocannon), several filter / sort / page
 *     mixes of BENCH_REGISTER_SECONDS (default 4) each: p50 / p95 / p99 (aim: p95 < 50 ms);
 *  3. GET /api/register/verify over every entry (aim: < 2 s, ok);
 *  4. GET /api/register.csv streamed to the end: time, rows, and the server's memory before and at
 *     its peak during the export (VmHWM reset first; aim: < 5 s, flat memory).
 * Runs the built app on BENCH_PORT against DATABASE_URL (scripts/bench.sh sets both).
 */
import autocannon from 'autocannon';
import knexFactory from 'knex';
import { fillRegister } from './register-entries';
import { BASE, pct, s, startServer } from './server';

const ENTRIES = Number(process.env.BENCH_REGISTER_ENTRIES ?? 100_000);
const SECONDS = Number(process.env.BENCH_REGISTER_SECONDS ?? 4);
const MIXES = [
  '/api/register',
  '/api/register?outcome=refused&sort=decided&dir=desc',
  '/api/register?year=2023&risk=3&sort=area&dir=asc&page=3',
  '/api/register?region=bench-district-2&current=true&sort=co2e&pageSize=50',
  '/api/register?areaMin=10&areaMax=30&sort=reference&dir=asc&page=20',
];
/** Word search reads every entry's text: timed one request at a time, not under the 50 clients. */
const SEARCH = '/api/register?q=PR-B0421';

async function fill(): Promise<void> {
  const knex = knexFactory({ client: 'pg', connection: process.env.DATABASE_URL });
  try {
    const t0 = performance.now();
    const added = await fillRegister(knex, ENTRIES);
    // What autovacuum does after a bulk insert: statistics and the visibility map (index-only scans).
    if (added) await knex.raw('vacuum analyze register_entry');
    const n = (await knex.raw('select count(*)::int as n from register_entry')).rows[0].n;
    console.log(`register: ${n} entries (${added} generated and chained in ${s(performance.now() - t0)})`);
  } finally {
    await knex.destroy();
  }
}

/** One mix under 50 connections: every response time, and how many answers were not 200. */
async function load(path: string): Promise<{ times: number[]; bad: number; rps: number }> {
  const times: number[] = [];
  let bad = 0;
  const result = await new Promise<autocannon.Result>((resolve, reject) => {
    const instance = autocannon({ url: `${BASE}${path}`, connections: 50, duration: SECONDS }, (err, r) =>
      err ? reject(err) : resolve(r),
    );
    instance.on('response', (_client, status, _bytes, ms) => (status === 200 ? times.push(ms) : bad++));
  });
  return { times, bad: bad + result.errors + result.timeouts, rps: result.requests.average };
}

async function list(): Promise<void> {
  // A started server loads its catalogues and worker threads in its first seconds (src/lib/warm-up.ts): let that finish first.
  await new Promise((r) => setTimeout(r, 5000));
  for (const path of MIXES) await fetch(`${BASE}${path}`).then((r) => r.text());
  const before = await load('/api/health');
  const all: number[] = [];
  for (const path of MIXES) {
    const { times, bad, rps } = await load(path);
    all.push(...times);
    if (!times.length) {
      console.log(`  ${path.padEnd(72)} no answer within ${SECONDS} s (${bad} failed)`);
      continue;
    }
    console.log(
      `  ${path.padEnd(72)} p50 ${pct(times, 50).toFixed(1)} ms, p95 ${pct(times, 95).toFixed(1)} ms, ` +
        `p99 ${pct(times, 99).toFixed(1)} ms, ${rps.toFixed(0)} req/s${bad ? `, ${bad} failed` : ''}`,
    );
  }
  console.log(
    `  list, all mixes: ${all.length} answers, p50 ${pct(all, 50).toFixed(1)} ms, p95 ${pct(all, 95).toFixed(1)} ms (aim: p95 < 50 ms with 50 clients)`,
  );
  // The floor on this machine: the cheapest route (one `select 1`) under the same 50 clients, before and after the list.
  const after = await load('/api/health');
  const floor = { times: [...before.times, ...after.times], rps: (before.rps + after.rps) / 2 };
  const ratio = pct(all, 95) / pct(floor.times, 95);
  console.log(
    `  for comparison, /api/health under the same load: p50 ${pct(floor.times, 50).toFixed(1)} ms, ` +
      `p95 ${pct(floor.times, 95).toFixed(1)} ms, ${floor.rps.toFixed(0)} req/s; list p95 / health p95 = ${ratio.toFixed(2)}`,
  );
  const times: number[] = [];
  for (let i = 0; i < 5; i++) {
    const t0 = performance.now();
    await fetch(`${BASE}${SEARCH}`).then((r) => r.text());
    times.push(performance.now() - t0);
  }
  console.log(
    `  ${SEARCH} alone, 5 times: p50 ${pct(times, 50).toFixed(1)} ms, max ${Math.max(...times).toFixed(1)} ms`,
  );
}

async function verify(): Promise<void> {
  for (const run of ['first', 'second']) {
    const t0 = performance.now();
    const v = (await (await fetch(`${BASE}/api/register/verify`)).json()) as {
      ok: boolean;
      entries: number;
      firstBrokenEntry: number | null;
    };
    console.log(
      `  verify (${run}): ok ${v.ok}, ${v.entries} entries, first broken ${v.firstBrokenEntry}, ${s(performance.now() - t0)} (aim: < 2 s)`,
    );
  }
}

async function csv(server: ReturnType<typeof startServer>): Promise<void> {
  const before = server.vm('VmRSS');
  server.resetPeak();
  const t0 = performance.now();
  const r = await fetch(`${BASE}/api/register.csv`);
  let [bytes, rows] = [0, 0];
  for await (const chunk of r.body as unknown as AsyncIterable<Uint8Array>) {
    bytes += chunk.byteLength;
    for (const b of chunk) if (b === 10) rows++;
  }
  const ms = performance.now() - t0;
  console.log(
    `  csv export: ${rows - 1} rows, ${(bytes / 1e6).toFixed(1)} MB in ${s(ms)} (aim: < 5 s); server RSS ` +
      `before ${before.toFixed(0)} MB, peak during ${server.vm('VmHWM').toFixed(0)} MB`,
  );
}

await fill();
const server = startServer();
try {
  await server.up();
  await list();
  await verify();
  await csv(server);
} finally {
  server.stop();
}
