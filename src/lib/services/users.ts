/** Admin changes to users: roles, name, deactivation. */
import type { Role } from '../auth/roles';
import { recordAudit } from '../db/audit';
import { db, withTransaction } from '../db/client';
import { countAdmins, deleteSessionsOf, getUser, updateUser, type UserSummary } from '../db/users';
import { HttpError } from '../http/errors';
import type { Caller } from '../http/handle';

/** `version` is the row version the administrator read: a change made meanwhile answers 409. */
export async function changeUser(
  by: Caller,
  id: string,
  version: number,
  patch: { name?: string; roles?: Role[]; active?: boolean },
): Promise<UserSummary> {
  return withTransaction(db, async (trx) => {
    const before = await getUser(trx, id);
    if (!before) throw new HttpError('NOT_FOUND', 'No such user.');
    const losesAdmin =
      before.roles.includes('admin') && ((patch.roles && !patch.roles.includes('admin')) || patch.active === false);
    if (losesAdmin && id === by.id)
      throw new HttpError('CONFLICT', 'You cannot remove your own administrator rights or deactivate yourself.');
    if (!(await updateUser(trx, id, version, patch)))
      throw new HttpError(
        'CONFLICT',
        `${before.name} was changed by someone else meanwhile. Reload the page to see their change, then try again.`,
      );
    if (losesAdmin && (await countAdmins(trx)) < 1)
      throw new HttpError('CONFLICT', 'At least one active administrator must remain.');
    if (patch.active === false) await deleteSessionsOf(trx, id); // roles are read per request; deactivation ends sessions now
    const after = (await getUser(trx, id))!;
    await recordAudit(trx, {
      actorId: by.id,
      action: 'user.update',
      entityType: 'user',
      entityId: id,
      details: changedFields(before, after),
    });
    return after;
  });
}

/** The fields an update changed, as `{ before, after }` (the audit log shows them as field: before → after). */
function changedFields(
  b: UserSummary,
  a: UserSummary,
): { before: Record<string, unknown>; after: Record<string, unknown> } {
  const before: Record<string, unknown> = {};
  const after: Record<string, unknown> = {};
  for (const k of ['name', 'roles', 'status'] as const) {
    if (JSON.stringify(b[k]) !== JSON.stringify(a[k])) {
      before[k] = b[k];
      after[k] = a[k];
    }
  }
  return { before, after };
}
