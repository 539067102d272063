/** Words for roles on the users page (pure). */
import { ROLES, ROLE_LABELS, type Role } from '~/lib/auth/roles';

export type AdminUser = {
  id: string;
  name: string;
  email: string;
  roles: Role[];
  status: 'invited' | 'active' | 'deactivated';
  version: number;
};

/** "Planner and Assessor"; roles in the fixed order of ROLES. */
export function rolesText(roles: Role[]): string {
  const names = ROLES.filter((r) => roles.includes(r)).map((r) => ROLE_LABELS[r]);
  return names.length <= 1 ? (names[0] ?? 'no role') : `${names.slice(0, -1).join(', ')} and ${names.at(-1)}`;
}

/** Why a role's box cannot be unticked, or null when it can. */
export function lockedReason(role: Role, pending: Role[], isSelf: boolean): string | null {
  if (pending.length === 1 && pending[0] === role)
    return 'it is the only role, and everyone needs one. Tick the new role first, then untick this one.';
  if (isSelf && role === 'admin' && pending.includes('admin'))
    return 'it is your own; another administrator must remove it.';
  return null;
}
