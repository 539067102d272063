/**
 * The app against a bare reference server (scripts/bench/bare-server.ts: node:http, the same SQL and
 * the same service function, nothing else) on the same database:
 *  - vector tiles at zooms 12-16 over the bench parcels, one client and 10 concurrent clients, each
 *    tile asked once per pass (so the app draws it: its kept tiles do not flatter the figure), then
 *    the app again over tiles it has drawn (kept by data version);
 *  - POST /api/estimates with 10 concurrent clients for BENCH_COMPARE_SECONDS (default 5) each.
 * Bare and app take turns (chunks of tiles, seconds of estimates), so a change in the machine's load
 * weighs on both.
 * Prints p50/p95 and requests per second, and the ratios. Aims: tiles p95 < 30 ms at every zoom for
 * one client and within 1.2x of bare at 10 clients; estimates at least 0.8x of bare's throughput.
 */
import { spawn } from 'node:child_process';
import { Agent, request } from 'node:http';
import { BASE, PORT, call, pct } from './server';

const BARE_PORT = Number(process.env.BENCH_BARE_PORT ?? PORT + 1);
const BARE = `http://127.0.0.1:${BARE_PORT}`;
const SECONDS = Number(process.env.BENCH_COMPARE_SECONDS ?? 5);
const ZOOMS = [12, 13, 14, 15, 16];
const PER_ZOOM = 40;

type Req = { url: string; method?: string; headers?: Record<string, string>; body?: string; zoom?: number };
type Timed = { ms: number; zoom?: number };

/** One request over a keep-alive agent; the answer is read in full (no compression asked). */
function send(agent: Agent, r: Req): Promise<number> {
  return new Promise((resolve, reject) => {
    const t0 = performance.now();
    const req = request(r.url, { agent, method: r.method ?? 'GET', headers: r.headers }, (res) => {
      res.on('data', () => undefined);
      res.on('end', () =>
        res.statusCode! < 300
          ? resolve(performance.now() - t0)
          : reject(new Error(`${r.method ?? 'GET'} ${r.url}: ${res.statusCode}`)),
      );
    });
    req.on('error', reject);
    req.end(r.body);
  });
}

/** `clients` loops taking the next request from `list` (each once), or cycling for `seconds`. */
async function load(list: Req[], clients: number, seconds?: number): Promise<{ times: Timed[]; perS: number }> {
  const agent = new Agent({ keepAlive: true, maxSockets: clients });
  const times: Timed[] = [];
  let next = 0;
  const t0 = performance.now();
  const until = seconds ? t0 + seconds * 1000 : Infinity;
  await Promise.all(
    Array.from({ length: clients }, async () => {
      while (seconds ? performance.now() < until : next < list.length) {
        const r = list[next++ % list.length]!;
        times.push({ ms: await send(agent, r), zoom: r.zoom });
      }
    }),
  );
  const perS = times.length / ((performance.now() - t0) / 1000);
  agent.destroy();
  return { times, perS };
}

type Run = { times: Timed[]; perS: number };

/**
 * Bare and app in turns (a chunk of `chunk` requests, or one second, each), so a machine whose load
 * changes while the benchmark runs weighs on both alike. Requests per second count only each side's own turns.
 */
async function inTurns(
  bare: Req[],
  app: Req[],
  clients: number,
  opts: { chunk?: number; seconds?: number },
): Promise<{ bare: Run; app: Run }> {
  const out = { bare: { times: [] as Timed[], ms: 0 }, app: { times: [] as Timed[], ms: 0 } };
  const turn = async (side: 'bare' | 'app', list: Req[], seconds?: number) => {
    const t0 = performance.now();
    const r = await load(list, clients, seconds);
    out[side].ms += performance.now() - t0;
    out[side].times.push(...r.times);
  };
  if (opts.seconds) {
    for (let i = 0; i < opts.seconds; i++) {
      await turn('bare', bare, 1);
      await turn('app', app, 1);
    }
  } else {
    const chunk = opts.chunk ?? 20;
    for (let i = 0; i < bare.length; i += chunk) {
      await turn('bare', bare.slice(i, i + chunk));
      await turn('app', app.slice(i, i + chunk));
    }
  }
  const run = (x: { times: Timed[]; ms: number }): Run => ({ times: x.times, perS: x.times.length / (x.ms / 1000) });
  return { bare: run(out.bare), app: run(out.app) };
}

function tileOf(lon: number, lat: number, z: number): [number, number] {
  const n = 2 ** z;
  const r = (lat * Math.PI) / 180;
  return [
    Math.floor(((lon + 180) / 360) * n),
    Math.floor(((1 - Math.log(Math.tan(r) + 1 / Math.cos(r)) / Math.PI) / 2) * n),
  ];
}

/** Distinct tiles over the extent per zoom, in a fixed shuffled order (LCG, common practice), cut into `passes` disjoint lists. */
function tileLists(extent: number[], passes: number): [number, number, number][][] {
  const out: [number, number, number][][] = Array.from({ length: passes }, () => []);
  let seed = 12345;
  const rand = () => (seed = (seed * 1103515245 + 12345) % 2 ** 31) / 2 ** 31;
  for (const z of ZOOMS) {
    const [x0, y1] = tileOf(extent[0]!, extent[1]!, z);
    const [x1, y0] = tileOf(extent[2]!, extent[3]!, z);
    const all: [number, number, number][] = [];
    for (let x = x0; x <= x1; x++) for (let y = y0; y <= y1; y++) all.push([z, x, y]);
    for (let i = all.length - 1; i > 0; i--) {
      const j = Math.floor(rand() * (i + 1));
      [all[i], all[j]] = [all[j]!, all[i]!];
    }
    // Small zooms have few tiles: lists repeat them (each list stays within itself distinct where it can).
    for (let p = 0; p < passes; p++)
      for (let i = 0; i < PER_ZOOM; i++) out[p]!.push(all[(p * PER_ZOOM + i) % all.length]!);
  }
  return out;
}

const f = (n: number) => n.toFixed(1);
function summary(label: string, r: Run): number {
  const ms = r.times.map((t) => t.ms);
  const zooms = ZOOMS.map((z) => r.times.filter((t) => t.zoom === z).map((t) => t.ms))
    .map((xs, i) => (xs.length ? `z${ZOOMS[i]} ${f(pct(xs, 95))}` : ''))
    .filter(Boolean);
  console.log(
    `  ${label.padEnd(34)} ${String(r.times.length).padStart(5)} req, ${f(r.perS).padStart(7)} req/s, ` +
      `p50 ${f(pct(ms, 50))} ms, p95 ${f(pct(ms, 95))} ms${zooms.length ? `  (p95 by zoom: ${zooms.join(', ')})` : ''}`,
  );
  return pct(ms, 95);
}

async function startBare() {
  const child = spawn(process.execPath, ['--import', 'tsx', 'scripts/bench/bare-server.ts'], {
    env: { ...process.env, NODE_ENV: 'production', BENCH_BARE_PORT: String(BARE_PORT) },
    stdio: ['ignore', 'inherit', 'inherit'],
  });
  for (let i = 0; i < 100; i++) {
    if (
      await fetch(`${BARE}/`).then(
        () => true,
        () => false,
      )
    )
      return child;
    await new Promise((r) => setTimeout(r, 200));
  }
  child.kill('SIGTERM');
  throw new Error('the bare reference server did not start');
}

/** A typical estimate request (the shape an assessment sends per parcel). */
const ESTIMATE = {
  climate: 'cool-temperate-moist',
  soils: [
    { type: 'hac', fraction: 0.6 },
    { type: 'spodic', fraction: 0.4 },
  ],
  areaHa: 12.5,
  before: { landUse: 'grassland', management: 'nominal', input: 'medium' },
  after: { landUse: 'cropland', system: 'long-term-cultivated', tillage: 'full', input: 'medium' },
  transitionYears: 20,
  gwp: 'ar5',
  biomass: true,
  n2o: true,
};

export async function compareWithBare(planner: string, extent: number[]): Promise<void> {
  const bare = await startBare();
  try {
    const map = await call<{ dataVersion: number; tileToken: string }>(planner, 'GET', '/api/map');
    const q = `?v=${map.data.dataVersion}&t=${encodeURIComponent(map.data.tileToken)}`;
    const [one, ten] = tileLists(extent, 2);
    const app = (l: [number, number, number][]) =>
      l.map(([z, x, y]) => ({ url: `${BASE}/api/tiles/${z}/${x}/${y}.mvt${q}`, zoom: z }));
    const ref = (l: [number, number, number][]) =>
      l.map(([z, x, y]) => ({ url: `${BARE}/tiles/${z}/${x}/${y}`, zoom: z }));
    await load(ref([...one!, ...ten!]), 2); // PostgreSQL's buffers warm for both servers
    console.log(
      `\ntiles, app (tile token, versioned URL) against the bare server (node:http + pg, same SQL); ${PER_ZOOM} tiles per zoom per pass:`,
    );
    const r1 = await inTurns(ref(one!), app(one!), 1, { chunk: 10 });
    const bare1 = summary('bare, 1 client', r1.bare);
    const app1 = summary('app, 1 client, tiles not yet drawn', r1.app);
    const r10 = await inTurns(ref(ten!), app(ten!), 10, { chunk: 40 });
    const bare10 = summary('bare, 10 clients', r10.bare);
    const app10 = summary('app, 10 clients, tiles not yet drawn', r10.app);
    summary('app, 1 client, tiles drawn before', await load(app(one!), 1));
    summary('app, 10 clients, tiles drawn before', await load(app(ten!), 10));
    console.log(
      `  ratio app/bare p95: 1 client ${(app1 / bare1).toFixed(2)}x, 10 clients ${(app10 / bare10).toFixed(2)}x ` +
        `(aim: p95 < 30 ms at every zoom for one client, within 1.2x at 10 clients)`,
    );

    const body = JSON.stringify(ESTIMATE);
    const post = (url: string, headers: Record<string, string>) => [
      {
        url,
        method: 'POST',
        headers: { 'content-type': 'application/json', 'content-length': String(Buffer.byteLength(body)), ...headers },
        body,
      },
    ];
    console.log(
      `\nPOST /api/estimates against the bare server calling the same service (runEstimate), 10 clients, ${SECONDS} s each:`,
    );
    await load(post(`${BARE}/estimates`, {}), 2, 1);
    await load(post(`${BASE}/api/estimates`, { cookie: planner, origin: BASE }), 2, 1);
    const e = await inTurns(
      post(`${BARE}/estimates`, {}),
      post(`${BASE}/api/estimates`, { cookie: planner, origin: BASE }),
      10,
      { seconds: SECONDS },
    );
    const [a, b] = [e.app, e.bare];
    summary('bare', b);
    summary('app', a);
    console.log(`  ratio app/bare throughput: ${(a.perS / b.perS).toFixed(2)}x (aim: at least 0.8x)`);
  } finally {
    bare.kill('SIGTERM');
  }
}
