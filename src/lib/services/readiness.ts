/**
 * Readiness (GET /api/ready): may the load balancer send this instance traffic? Yes when the
 * database answers and every migration file this build ships has been applied, and no migration
 * is running. Migrations the build does not know (a newer release migrated first, as in a rolling
 * deployment) do not stop it: migrations only add. Liveness stays /api/health.
 */
import { db, replica } from '../db/client';
import { migrationState } from '../db/migration-state';
import { HttpError } from '../http/errors';

export async function readiness(): Promise<{
  ready: true;
  database: true;
  migrations: { applied: number; pending: number };
}> {
  try {
    await db.raw('select 1');
  } catch {
    throw new HttpError('SERVICE_UNAVAILABLE', 'Not ready: the database does not answer.');
  }
  if (replica !== db) {
    try {
      await replica.raw('select 1');
    } catch {
      throw new HttpError('SERVICE_UNAVAILABLE', 'Not ready: the read replica (DATABASE_REPLICA_URL) does not answer.');
    }
  }
  let state;
  try {
    state = await migrationState(db);
  } catch {
    throw new HttpError(
      'SERVICE_UNAVAILABLE',
      'Not ready: the migration state could not be read (is the migrations folder beside the build?).',
    );
  }
  if (state.locked) throw new HttpError('SERVICE_UNAVAILABLE', 'Not ready: a migration is running.');
  if (state.pending.length) {
    const names = state.pending.slice(0, 3).join(', ') + (state.pending.length > 3 ? ', …' : '');
    throw new HttpError(
      'SERVICE_UNAVAILABLE',
      `Not ready: ${state.pending.length} migration(s) pending (${names}); run \`npm run migrate latest\`.`,
    );
  }
  return { ready: true, database: true, migrations: { applied: state.applied, pending: 0 } };
}
