/**
 * The benchmark's bare reference server: node:http with no framework, no session, no middleware,
 * no compression. `GET /tiles/{z}/{x}/{y}` runs the app's tile SQL (TILE_SQL of src/lib/db/tiles.ts)
 * through a plain pg pool of the app's size; `POST /estimates` parses the body with the route's own
 * schema and calls the same service function as the route (runEstimate). What the app adds on top
 * of these (routing, middleware, authorisation, headers, compression) is what the ratios measure.
 * Started by scripts/bench/compare.ts on BENCH_BARE_PORT.
 */
import { createServer } from 'node:http';
import pg from 'pg';
import { estimateBodySchema } from '../../src/lib/api/estimates';
import { TILE_SQL, tileBindings } from '../../src/lib/db/tiles';
import { runEstimate } from '../../src/lib/services/estimates';

const port = Number(process.env.BENCH_BARE_PORT);
const pool = new pg.Pool({ connectionString: process.env.DATABASE_URL, max: Number(process.env.DB_POOL_MAX ?? 8) });
let n = 0;
const text = TILE_SQL.replace(/\?/g, () => `$${++n}`);

createServer((req, res) => {
  const tile = /^\/tiles\/(\d+)\/(\d+)\/(\d+)$/.exec(req.url ?? '');
  const fail = (err: unknown) => {
    res.writeHead(500).end(String(err));
  };
  if (req.method === 'GET' && tile) {
    const [z, x, y] = tile.slice(1).map(Number) as [number, number, number];
    pool
      .query(text, tileBindings(z, x, y))
      .then(
        (r) => res.writeHead(200, { 'content-type': 'application/vnd.mapbox-vector-tile' }).end(r.rows[0].tile),
        fail,
      );
    return;
  }
  if (req.method === 'POST' && req.url === '/estimates') {
    const chunks: Buffer[] = [];
    req.on('data', (c: Buffer) => chunks.push(c));
    req.on('end', () => {
      runEstimate(estimateBodySchema.parse(JSON.parse(Buffer.concat(chunks).toString()))).then(
        (out) => res.writeHead(200, { 'content-type': 'application/json' }).end(JSON.stringify(out)),
        fail,
      );
    });
    return;
  }
  res.writeHead(404).end();
}).listen(port, '127.0.0.1', () => console.log(`bare reference server on 127.0.0.1:${port}`));
