/** The single Knex instance (server-only). Nothing else calls knex(...). */
import knexFactory, { type Knex } from 'knex';
import pg from 'pg';
import knexConfig from '../../../knexfile';
import { config } from '../config';
import { onServerClose } from '../shutdown';

// int8 (count(*), bigserial ids) as JS numbers: our counts and ids stay far below 2^53.
pg.types.setTypeParser(20, (v) => Number(v));
// numeric as JS numbers: factor values and areas are stored as numeric for exactness at rest.
pg.types.setTypeParser(1700, (v) => Number(v));

export type Db = Knex | Knex.Transaction;

export const db: Knex = knexFactory({ ...knexConfig, connection: config().DATABASE_URL });

/**
 * Where the public register reads (list, entries, exports, notices, tiles): a streaming replica
 * when DATABASE_REPLICA_URL is set, else the primary itself. A replica lags a moment behind, so
 * nothing that writes, locks, or must see what was just written reads through it (README,
 * "Read replicas"). Its connections are opened only when used.
 */
const replicaUrl = config().DATABASE_REPLICA_URL;
export const replica: Knex = replicaUrl ? knexFactory({ ...knexConfig, connection: replicaUrl }) : db;

// On shutdown the pool closes last, after the requests and workers that use it (scripts/serve.mjs).
onServerClose(() => Promise.all([db.destroy(), replica === db ? undefined : replica.destroy()]).then(() => undefined));

/** Runs fn in the given transaction, or opens one: services open it, repositories accept it. */
export async function withTransaction<T>(outer: Db, fn: (trx: Knex.Transaction) => Promise<T>): Promise<T> {
  if (outer.isTransaction) return fn(outer as Knex.Transaction);
  return (outer as Knex).transaction(fn);
}
