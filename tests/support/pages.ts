/**
 * Every page of the app, with who may open it and its script budget: the one list the accessibility
 * sweep and the script-budget test walk. Ids of pages with parameters come from the seeded demo data.
 */
import type { Role } from '../../src/lib/auth/roles';
import { testDb } from './db';

export type Viewer = Role | 'public';
/** Budgets in kB of script sent per page after compression (see DEVELOPERS.md, "Script budgets"). */
export type BudgetKind = 'entry' | 'plain' | 'calculator' | 'map';
export const BUDGET_KB: Record<BudgetKind, number> = { entry: 25, plain: 80, calculator: 150, map: 200 };

export type PageCase = {
  path: string;
  viewers: Viewer[];
  budget: BudgetKind;
  /** a 404/403 page is expected */ status?: number;
};

const STAFF: Role[] = ['planner', 'assessor', 'board', 'chair', 'admin'];
const ALL: Viewer[] = ['public', ...STAFF];
const RULE_READERS: Role[] = ['admin', 'assessor', 'board', 'chair'];

async function first<T>(sql: string): Promise<T> {
  const { rows } = await testDb.raw(sql);
  if (!rows[0]) throw new Error(`the demo data has no row for: ${sql}`);
  return rows[0] as T;
}

export async function allPages(): Promise<PageCase[]> {
  const proposal = await first<{ id: string }>(
    `select p.id from proposal p where exists (select 1 from assessment a where a.proposal_id = p.id and a.status = 'signed') order by p.id limit 1`,
  );
  const draft = await first<{ id: string }>(
    `select p.id from proposal p join "user" u on u.id = p.created_by where p.state = 'draft' and u.email = 'planner@tarrow.example' order by p.id limit 1`,
  );
  const pair = await first<{ a: string; b: string }>(
    `select min(id) as a, max(id) as b from assessment having count(*) > 1`,
  );
  const meeting = await first<{ id: string }>(`select id from meeting order by meeting_date desc, id desc limit 1`);
  const entry = await first<{ seq: string }>(`select seq from register_entry order by seq limit 1`);
  const factorSet = await first<{ id: string; v: number }>(
    `select set_id as id, max(version) as v from factor_set_version where status = 'published' group by set_id order by set_id limit 1`,
  );
  const ruleSet = await first<{ id: string; v: number }>(
    `select set_id as id, max(version) as v from rule_set_version where status = 'published' group by set_id order by set_id limit 1`,
  );
  return [
    { path: '/', viewers: ALL, budget: 'plain' },
    { path: '/sign-in', viewers: ['public'], budget: 'entry' },
    { path: '/forgot-password', viewers: ['public'], budget: 'entry' },
    { path: '/welcome?token=not-a-real-token', viewers: ['public'], budget: 'entry' },
    { path: '/reset-password?token=not-a-real-token', viewers: ['public'], budget: 'entry' },
    { path: '/no-such-page', viewers: ['public', 'planner'], budget: 'plain', status: 404 },
    { path: '/admin/users', viewers: ['planner'], budget: 'plain', status: 403 },
    { path: '/register', viewers: ALL, budget: 'plain' },
    { path: `/register/${entry.seq}`, viewers: ['public', 'board'], budget: 'map' },
    ...STAFF.map((r): PageCase => ({ path: `/work/${r}`, viewers: [r], budget: 'plain' })),
    { path: '/proposals', viewers: STAFF, budget: 'plain' },
    { path: '/proposals/new', viewers: ['planner'], budget: 'map' },
    { path: `/proposals/${proposal.id}`, viewers: STAFF, budget: 'map' },
    { path: `/proposals/${draft.id}/edit`, viewers: ['planner'], budget: 'map' },
    { path: `/assessments/${pair.b}`, viewers: STAFF, budget: 'plain' },
    { path: `/assessments/compare?a=${pair.a}&b=${pair.b}`, viewers: ['assessor', 'board'], budget: 'plain' },
    { path: '/dashboard', viewers: STAFF, budget: 'plain' },
    { path: '/board', viewers: ['board', 'chair', 'admin'], budget: 'plain' },
    { path: `/board/meetings/${meeting.id}`, viewers: ['board', 'chair', 'admin'], budget: 'plain' },
    { path: '/map', viewers: STAFF, budget: 'map' },
    { path: '/screening', viewers: STAFF, budget: 'map' },
    { path: '/follow-ups', viewers: ['assessor', 'board', 'chair', 'admin'], budget: 'plain' },
    { path: '/parcels/upload', viewers: ['planner', 'admin'], budget: 'plain' },
    { path: '/calculator', viewers: STAFF, budget: 'calculator' },
    { path: '/admin/factor-sets', viewers: ['admin', 'assessor'], budget: 'plain' },
    { path: `/admin/factor-sets/${factorSet.id}`, viewers: ['admin', 'assessor'], budget: 'plain' },
    {
      path: `/admin/factor-sets/diff?a=${factorSet.id}@1&b=${factorSet.id}@${factorSet.v}`,
      viewers: ['admin'],
      budget: 'plain',
    },
    { path: '/admin/rule-sets', viewers: RULE_READERS, budget: 'plain' },
    { path: `/admin/rule-sets/${ruleSet.id}`, viewers: RULE_READERS, budget: 'plain' },
    {
      path: `/admin/rule-sets/diff?a=${ruleSet.id}@1&b=${ruleSet.id}@${ruleSet.v}`,
      viewers: ['chair'],
      budget: 'plain',
    },
    { path: '/admin/reference-layers', viewers: ['admin'], budget: 'plain' },
    { path: '/admin/reference-layers/upload', viewers: ['admin'], budget: 'plain' },
    { path: '/admin/territory', viewers: ['admin'], budget: 'map' },
    { path: '/admin/users', viewers: ['admin'], budget: 'plain' },
    { path: '/admin/mail', viewers: ['admin'], budget: 'plain' },
    { path: '/admin/audit', viewers: ['admin'], budget: 'plain' },
  ];
}
