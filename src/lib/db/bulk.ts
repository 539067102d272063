import type { Db } from './client';

/**
 * Refreshes the planner's statistics for tables a bulk statement has just written, inside the
 * caller's transaction (ANALYZE sees the transaction's own rows). Without it, PostgreSQL plans the
 * next join of the new rows from statistics taken while the tables were empty (the normal state
 * after autovacuum has run once after an earlier upload) and picks a nested loop over the whole
 * batch. Call it after bulk writes only, never per single-row edit. Tables are named by the
 * caller from a fixed list, in one order (upload_staging_feature, parcel, land_use_event,
 * parcel_overlay_run, parcel_overlay, reference_feature, reference_piece), so concurrent saves queue, not deadlock.
 */
export const BULK_TABLES = [
  'upload_staging_feature',
  'parcel',
  'land_use_event',
  'parcel_overlay_run',
  'parcel_overlay',
  'reference_feature',
  'reference_piece',
  'screening_result',
] as const;
export async function analyzeAfterBulkWrite(conn: Db, ...tables: (typeof BULK_TABLES)[number][]): Promise<void> {
  for (const t of BULK_TABLES) if (tables.includes(t)) await conn.raw(`analyze ${t}`);
}

/**
 * Plans the rest of the caller's transaction without parallel workers (SET LOCAL). An upload's
 * validation and save are many short GiST-probe joins over one batch: each parallel worker first
 * loads PostGIS, which costs more than it saves (measured on the 2-core bench machine: the
 * register overlap check 0.43-0.61 s serial against 0.77-1.03 s parallel), and the machine's
 * cores are better left to the other requests an ingest must not block.
 * JIT compilation is off too: the planner's costs for these PostGIS joins pass the JIT thresholds, so
 * each heavy statement spent most of a second compiling and inlining expressions while its time goes
 * into PostGIS functions, which JIT cannot speed up (measured: the in-file overlap check of 3,000
 * features against a 100,000-feature file, 1.64 s with JIT, 0.74 s without).
 */
export async function serialPlans(conn: Db): Promise<void> {
  await conn.raw('set local max_parallel_workers_per_gather = 0; set local jit = off');
}
