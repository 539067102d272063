import { health } from '~/lib/api/admin';
import { db } from '~/lib/db/client';
import { handle } from '~/lib/http/handle';
import { warmGisPool } from '~/lib/workers/pool';

export const GET = handle(health, async () => {
  warmGisPool();
  await db.raw('select 1');
  return { ok: true, database: true };
});
