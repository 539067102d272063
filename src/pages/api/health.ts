import { health } from '~/lib/api/admin';
import { db } from '~/lib/db/client';
import { handle } from '~/lib/http/handle';
import { warmUp } from '~/lib/warm-up';

export const GET = handle(health, async () => {
  warmUp();
  await db.raw('select 1');
  return { ok: true, database: true };
});
