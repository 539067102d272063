// Entry of a GIS worker thread (tinypool, see pool.ts). It loads the TypeScript tasks through
// tsx, as the migrations and the seed do, so the same source runs in the app and in the pool.
import { register } from 'tsx/esm/api';

register();
const { tasks } = await import('./gis-tasks.ts');

export default function run({ task, input }) {
  return tasks[task](input);
}
