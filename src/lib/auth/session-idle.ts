/**
 * The session idle timeout (app setting "auth.session.idle-minutes", default a working day):
 * a session not used for that long is ended on its next request. Last use is the session row's
 * updatedAt in PostgreSQL, written at most once a minute, so every instance agrees.
 */
import type { Db } from '../db/client';
import { getSecuritySettings } from '../db/security-settings';

const TOUCH_EVERY_MS = 60_000;

/** True while the session is live (and records this use); false after deleting an idle one. */
export async function useSession(
  db: Db,
  session: { id: string; updatedAt: Date | string },
  now = Date.now(),
): Promise<boolean> {
  const idleMs = (await getSecuritySettings(db))['auth.session.idle-minutes'] * 60_000;
  const lastMs = new Date(session.updatedAt).getTime();
  if (now - lastMs > idleMs) {
    await db('session').where({ id: session.id }).delete();
    return false;
  }
  if (now - lastMs > TOUCH_EVERY_MS)
    await db('session')
      .where({ id: session.id })
      .update({ updatedAt: new Date(now) });
  return true;
}
