/** The signed-in navigation: what each role sees (pure; the header renders it). */
import type { Role } from './auth/roles';

export type NavItem = { href: string; label: string; roles: readonly Role[] | 'all' };

export const NAV: NavItem[] = [
  { href: '/work', label: 'Home', roles: 'all' },
  { href: '/proposals', label: 'Proposals', roles: ['planner', 'assessor', 'board', 'chair', 'admin'] },
  { href: '/dashboard', label: 'Dashboard', roles: ['planner', 'assessor', 'board', 'chair', 'admin'] },
  { href: '/board', label: 'Board', roles: ['board', 'chair', 'admin'] },
  { href: '/map', label: 'Map', roles: 'all' },
  { href: '/screening', label: 'Screening', roles: ['planner', 'assessor', 'board', 'chair', 'admin'] },
  { href: '/follow-ups', label: 'Follow-ups', roles: ['assessor', 'board', 'chair', 'admin'] },
  { href: '/parcels/upload', label: 'Upload parcels', roles: ['planner', 'admin'] },
  { href: '/calculator', label: 'Carbon calculator', roles: 'all' },
  { href: '/admin/factor-sets', label: 'Factor sets', roles: ['admin', 'assessor'] },
  { href: '/admin/rule-sets', label: 'Rule sets', roles: ['admin', 'assessor', 'board', 'chair'] },
  { href: '/admin/reference-layers', label: 'Reference layers', roles: ['admin'] },
  { href: '/admin/territory', label: 'Territory', roles: ['admin'] },
  { href: '/admin/users', label: 'Users', roles: ['admin'] },
  { href: '/admin/mail', label: 'Mail box', roles: ['admin'] },
  { href: '/admin/audit', label: 'Audit log', roles: ['admin'] },
];

export function navFor(roles: readonly Role[]): NavItem[] {
  return NAV.filter((i) => i.roles === 'all' || i.roles.some((r) => roles.includes(r)));
}
