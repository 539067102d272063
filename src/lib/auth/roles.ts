/** The roles a user may hold (several at once, stored comma-separated on user.role). Pure: islands may import it. */
export const ROLES = ['planner', 'assessor', 'board', 'chair', 'admin'] as const;
export type Role = (typeof ROLES)[number];

export const ROLE_LABELS: Record<Role, string> = {
  planner: 'Planner',
  assessor: 'Assessor',
  board: 'Board member',
  chair: 'Board chair',
  admin: 'Administrator',
};

export function parseRoles(value: string | null | undefined): Role[] {
  if (!value) return [];
  const wanted = new Set(value.split(',').map((r) => r.trim()));
  return ROLES.filter((r) => wanted.has(r));
}

export function formatRoles(roles: readonly Role[]): string {
  return ROLES.filter((r) => roles.includes(r)).join(',');
}

export function hasAnyRole(held: readonly Role[], wanted: readonly Role[]): boolean {
  return wanted.some((r) => held.includes(r));
}
