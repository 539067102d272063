/**
 * The floor the ingest is measured against: the same zipped shapefile loaded plainly into a scratch
 * table of the bench database by GDAL's ogr2ogr (`-f PostgreSQL PG:… /vsizip/…`) and by PostGIS's
 * `shp2pgsql … | psql` (the zip unpacked beforehand, outside the timing), BENCH_REF_RUNS times each
 * (default 3). No validation, reprojection, areas, overlay or history: a plain load is a floor, not
 * a rival. Prints each run, min and median, and appends `<size> <tool> <minS> <medianS>` to
 * BENCH_REF_RESULTS for scripts/bench.ts and scripts/bench/ingest-summary.ts.
 * Run by scripts/bench.sh: node --import tsx scripts/bench/reference-loads.ts <zip> <size>
 */
import { execFileSync, spawn } from 'node:child_process';
import { appendFileSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';

const [zip, size] = process.argv.slice(2);
if (!zip || !size) throw new Error('usage: reference-loads.ts <zip> <size>');
const RUNS = Math.max(1, Number(process.env.BENCH_REF_RUNS ?? 3));
const url = new URL(process.env.DATABASE_URL!);
const env = {
  ...process.env,
  PGHOST: url.hostname,
  PGPORT: url.port,
  PGUSER: decodeURIComponent(url.username),
  PGPASSWORD: decodeURIComponent(url.password),
  PGDATABASE: url.pathname.slice(1),
};
const pgConn = `PG:host=${url.hostname} port=${url.port} user=${env.PGUSER} password=${env.PGPASSWORD} dbname=${env.PGDATABASE}`;

const psql = (sql: string) =>
  execFileSync('psql', ['-qAtX', '-v', 'ON_ERROR_STOP=1', '-c', 'set client_min_messages = warning', '-c', sql], {
    env,
    stdio: ['ignore', 'pipe', 'inherit'],
  })
    .toString()
    .trim();

function timed(fn: () => void): number {
  const t0 = performance.now();
  fn();
  return performance.now() - t0;
}

function ogr(table: string): void {
  execFileSync(
    'ogr2ogr',
    [
      '-f',
      'PostgreSQL',
      pgConn,
      `/vsizip/${resolve(zip!)}`,
      '-nln',
      table,
      '-overwrite',
      '-nlt',
      'PROMOTE_TO_MULTI',
      '-lco',
      'GEOMETRY_NAME=geom',
    ],
    { env, stdio: ['ignore', 'ignore', 'inherit'] },
  );
}

/** shp2pgsql (dump format = COPY, with a GiST index) piped into psql, as the PostGIS manual shows. */
async function shp(dir: string, table: string): Promise<void> {
  const srid = '32628';
  await new Promise<void>((done, fail) => {
    const dump = spawn('shp2pgsql', ['-D', '-I', '-s', srid, join(dir, 'bench_parcels.shp'), table], {
      env,
      stdio: ['ignore', 'pipe', 'pipe'],
    });
    let said = '';
    dump.stderr.on('data', (b: Buffer) => (said += b.toString()));
    const load = spawn('psql', ['-qX', '-v', 'ON_ERROR_STOP=1', '-o', '/dev/null'], {
      env,
      stdio: ['pipe', 'ignore', 'inherit'],
    });
    dump.stdout.pipe(load.stdin);
    let left = 2;
    const end = (what: string) => (code: number | null) =>
      code === 0 ? --left === 0 && done() : fail(new Error(`${what} exited with ${code} ${said}`));
    dump.on('exit', end('shp2pgsql'));
    load.on('exit', end('psql'));
  });
}

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor((xs.length - 1) / 2)]!;

function report(tool: string, ms: number[]): void {
  const [min, med] = [Math.min(...ms) / 1000, median(ms) / 1000];
  console.log(
    `  ${tool.padEnd(18)} ${ms.map((m) => (m / 1000).toFixed(2)).join(' / ')} s   min ${min.toFixed(2)} s, median ${med.toFixed(2)} s`,
  );
  if (process.env.BENCH_REF_RESULTS)
    appendFileSync(process.env.BENCH_REF_RESULTS, `${size} ${tool} ${min.toFixed(3)} ${med.toFixed(3)}\n`);
}

const dir = mkdtempSync(join(tmpdir(), 'swardkeep-bench-shp-'));
try {
  execFileSync('unzip', ['-qo', resolve(zip), '-d', dir]);
  psql('create extension if not exists postgis');
  const ogrMs: number[] = [];
  const shpMs: number[] = [];
  for (let i = 0; i < RUNS; i++) {
    psql('drop table if exists bench_ref_ogr, bench_ref_shp');
    ogrMs.push(timed(() => ogr('bench_ref_ogr')));
    const t0 = performance.now();
    await shp(dir, 'bench_ref_shp');
    shpMs.push(performance.now() - t0);
  }
  const rows = psql("select (select count(*) from bench_ref_ogr) || ' / ' || (select count(*) from bench_ref_shp)");
  console.log(`plain loads of ${zip} (rows ogr2ogr / shp2pgsql: ${rows}), ${RUNS} run(s) each:`);
  report('ogr2ogr', ogrMs);
  report('shp2pgsql|psql', shpMs);
} finally {
  psql('drop table if exists bench_ref_ogr, bench_ref_shp');
  rmSync(dir, { recursive: true, force: true });
}
