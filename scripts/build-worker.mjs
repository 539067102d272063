/**
 * Bundles the GIS worker's tasks (src/lib/workers/gis-tasks.ts and everything it imports) into one
 * plain ES module beside the built server (`node scripts/build-worker.mjs dist`, run after
 * `astro build`): the built app's pool threads load it (scripts/serve.mjs points
 * SWARDKEEP_GIS_WORKER at it), so no thread compiles TypeScript through tsx at start, which costs
 * each thread some 50 MB of resident memory. Source runs (tests of the services, scripts) still use
 * src/lib/workers/gis-worker.mjs.
 */
import path from 'node:path';
import { build } from 'esbuild';

const dist = path.resolve(process.argv[2] ?? 'dist');
await build({
  stdin: {
    contents:
      "import { tasks } from './gis-tasks';\nexport default function run({ task, input }) { return tasks[task](input); }\n",
    resolveDir: path.resolve('src/lib/workers'),
    sourcefile: 'gis-worker-bundle.ts',
    loader: 'ts',
  },
  bundle: true,
  platform: 'node',
  format: 'esm',
  target: 'node20',
  // Some dependencies are CommonJS and call require() for Node's own modules.
  banner: {
    js: "import { createRequire as __createRequire } from 'node:module';\nconst require = __createRequire(import.meta.url);",
  },
  outfile: path.join(dist, 'server/gis-worker.mjs'),
  logLevel: 'warning',
});
