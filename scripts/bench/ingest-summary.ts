/**
 * The ingest lines that end `npm run bench`: per size, Swardkeep's upload-to-saved (min / median over
 * every run), ogr2ogr's and shp2pgsql's plain loads of the same file, the ratios and the peak server
 * memory, each marked PASS or over against the aims (scripts/bench/ingest-watch.ts).
 * Usage: node --import tsx scripts/bench/ingest-summary.ts <results file> (BENCH_REF_RESULTS set)
 */
import { readFileSync } from 'node:fs';
import { MEMORY_AIM_MB, plainLoad, ratioAim } from './ingest-watch';

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor((xs.length - 1) / 2)]!;
const rows = readFileSync(process.argv[2]!, 'utf8')
  .trim()
  .split('\n')
  .filter(Boolean)
  .map((l) => l.split(' '));
const sizes = [...new Set(rows.map((r) => Number(r[0])))].sort((a, b) => a - b);
console.log(
  '\ningest against the plain loads of the same file (min / median; ratio = Swardkeep median / ogr2ogr median):',
);
for (const size of sizes) {
  const mine = rows.filter((r) => Number(r[0]) === size);
  const secs = mine.map((r) => Number(r[2]));
  const peak = Math.max(...mine.map((r) => Number(r[3] ?? 0)));
  const [min, med] = [Math.min(...secs), median(secs)];
  const ogr = plainLoad(size);
  const shp = plainLoad(size, 'shp2pgsql|psql');
  const refs = [
    ogr && `ogr2ogr ${ogr.min.toFixed(2)} / ${ogr.median.toFixed(2)} s`,
    shp && `shp2pgsql|psql ${shp.min.toFixed(2)} / ${shp.median.toFixed(2)} s`,
  ]
    .filter(Boolean)
    .join(', ');
  const ratio = ogr
    ? `${(min / ogr.min).toFixed(1)}x / ${(med / ogr.median).toFixed(1)}x ` +
      `(aim ${ratioAim(size)}x: ${med / ogr.median <= ratioAim(size) && Math.max(...secs) / ogr.median <= ratioAim(size) ? 'PASS' : 'over'})`
    : 'no plain load';
  console.log(
    `  ${String(size).padStart(6)} parcels: Swardkeep ${min.toFixed(2)} / ${med.toFixed(2)} s over ${secs.length} run(s); ${refs || 'no plain loads'}`,
  );
  console.log(
    `          ratio ${ratio}; peak server memory ${peak} MB (aim < ${MEMORY_AIM_MB} MB: ${peak < MEMORY_AIM_MB ? 'PASS' : 'over'})`,
  );
}
