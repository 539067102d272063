/** Admin changes to users: roles, name, deactivation. */
import type { Role } from '../auth/roles';
import { recordAudit } from '../db/audit';
import { db, withTransaction } from '../db/client';
import { countAdmins, deleteSessionsOf, getUser, updateUser, type UserSummary } from '../db/users';
import { HttpError } from '../http/errors';
import type { Caller } from '../http/handle';

export async function changeUser(by: Caller, id: string, patch: { name?: string; roles?: Role[]; active?: boolean }): Promise<UserSummary> {
  return withTransaction(db, async (trx) => {
    const before = await getUser(trx, id);
    if (!before) throw new HttpError('NOT_FOUND', 'No such user.');
    const losesAdmin = before.roles.includes('admin') && ((patch.roles && !patch.roles.includes('admin')) || patch.active === false);
    if (losesAdmin && id === by.id) throw new HttpError('CONFLICT', 'You cannot remove your own administrator rights or deactivate yourself.');
    await updateUser(trx, id, patch);
    if (losesAdmin && (await countAdmins(trx)) < 1) throw new HttpError('CONFLICT', 'At least one active administrator must remain.');
    if (patch.active === false) await deleteSessionsOf(trx, id); // roles are read per request; deactivation ends sessions now
    await recordAudit(trx, { actorId: by.id, action: 'user.update', entityType: 'user', entityId: id, details: { before: { roles: before.roles, status: before.status }, patch } });
    return (await getUser(trx, id))!;
  });
}
