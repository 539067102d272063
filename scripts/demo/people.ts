/** The invented staff of the invented Upper Tarrow Grassland Authority (demo only). */
import type { Role } from '../../src/lib/auth/roles';

export const DEMO_PASSWORD = 'meadow-lark-2026';

export const DEMO_PEOPLE: { name: string; email: string; roles: Role[] }[] = [
  { name: 'Ilse Marrow', email: 'admin@tarrow.example', roles: ['admin'] },
  { name: 'Tomas Brevin', email: 'planner@tarrow.example', roles: ['planner'] },
  { name: 'Ada Quill', email: 'assessor@tarrow.example', roles: ['assessor'] },
  { name: 'Rennick Hale', email: 'board@tarrow.example', roles: ['board'] },
  { name: 'Oona Vetch', email: 'chair@tarrow.example', roles: ['board', 'chair'] },
];
