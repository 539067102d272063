/**
 * The worker pool for CPU-heavy GIS steps (tinypool over worker_threads): parsing, proj4
 * reprojection and validation run there, so /api/health and every other request keep flowing
 * while a 300,000-vertex polygon is checked. Each instance has its own pool (threads, not shared
 * state). GIS_WORKERS sets the number of threads (default 2). The threads load SWARDKEEP_GIS_WORKER
 * when set (the built app: scripts/serve.mjs sets it to the bundle scripts/build-worker.mjs writes), else
 * the TypeScript source through tsx, found under the app's root (SWARDKEEP_ROOT, default the working directory).
 */
import { resolve } from 'node:path';
import { pathToFileURL } from 'node:url';
import { MessageChannel, type MessagePort } from 'node:worker_threads';
import Tinypool from 'tinypool';
import { GisInputError, type GisInputErrorCode } from '../gis/errors';
import { HttpError, type ErrorCode } from '../http/errors';
import type { TaskName, TaskResult, tasks } from './gis-tasks';

let pool: Tinypool | null = null;
const YOUNG_GENERATION_MB = 12;
/**
 * The threads' old-generation limit. V8 sizes a heap's growth by its limit (by up to 4x the live objects with the
 * default of several gigabytes, about 1.8x at 1,536 MB), so the limit keeps the garbage of a 100,000-parcel upload from
 * piling up before it is collected: some 70 MB less resident memory for a few per cent more time in the thread.
 */
const OLD_GENERATION_MB = Number(process.env.GIS_WORKER_HEAP_MB ?? 1536);

function workerFile(): string {
  const root = process.env.SWARDKEEP_ROOT ?? process.cwd();
  return pathToFileURL(resolve(root, process.env.SWARDKEEP_GIS_WORKER || 'src/lib/workers/gis-worker.mjs')).href;
}

function getPool(): Tinypool {
  pool ??= new Tinypool({
    filename: workerFile(),
    minThreads: 1,
    maxThreads: Math.max(1, Number(process.env.GIS_WORKERS ?? 2)),
    idleTimeout: 120_000,
    // A small young generation (V8's default grows to tens of megabytes per thread): an upload's chunks make much
    // short-lived garbage, and a smaller nursery keeps the threads' resident memory down at no measured cost in speed.
    resourceLimits: { maxYoungGenerationSizeMb: YOUNG_GENERATION_MB, maxOldGenerationSizeMb: OLD_GENERATION_MB },
  });
  return pool;
}

type Input<N extends TaskName> = Parameters<(typeof tasks)[N]>[0];
type Output<N extends TaskName> = Awaited<ReturnType<(typeof tasks)[N]>> extends TaskResult<infer T> ? T : never;

/** Runs a task in the pool; expected failures come back as GisInputError or HttpError. */
export async function runGisTask<N extends TaskName>(
  task: N,
  input: Input<N>,
  transferList?: MessagePort[],
): Promise<Output<N>> {
  const result = (await getPool()
    .run({ task, input }, transferList ? { transferList } : {})
    .catch((error: unknown) => {
      if ((error as { code?: unknown } | null)?.code !== 'ERR_WORKER_OUT_OF_MEMORY') throw error;
      throw new HttpError(
        'PAYLOAD_TOO_LARGE',
        'The file is too large to check in one go: the checking ran out of memory. Split it into smaller files.',
      );
    })) as TaskResult<Output<N>>;
  if (result.ok) return result.value;
  const e = result.error;
  if (e.kind === 'gis') throw new GisInputError(e.code as GisInputErrorCode, e.message);
  throw new HttpError(e.code as ErrorCode, e.message, e.issues as ConstructorParameters<typeof HttpError>[2]);
}

type StreamTask = { [N in TaskName]: Input<N> extends { port: MessagePort } ? N : never }[TaskName];

/**
 * Runs a task that posts text chunks on a port (gis-tasks.ts, chunkSender) and hands each chunk to
 * `onChunk` as it arrives, one at a time and in order, answering the worker when it is done. When
 * `onChunk` fails the worker is told to stop and that error is thrown once the task has ended.
 */
export async function runGisStream<N extends StreamTask>(
  task: N,
  input: Omit<Input<N>, 'port'>,
  onChunk: (text: string) => Promise<void>,
): Promise<Output<N>> {
  const { port1, port2 } = new MessageChannel();
  let failed: { error: unknown } | null = null;
  let chain = Promise.resolve();
  port1.on('message', (text: string) => {
    chain = chain.then(async () => {
      if (!failed) {
        try {
          await onChunk(text);
        } catch (error) {
          failed = { error };
        }
      }
      port1.postMessage(failed ? 'stop' : 'ack');
    });
  });
  try {
    const result = await runGisTask(task, { ...input, port: port2 } as Input<N>, [port2]);
    await chain;
    if (failed) throw (failed as { error: unknown }).error;
    return result;
  } catch (error) {
    await chain;
    throw failed ? (failed as { error: unknown }).error : error;
  } finally {
    port1.close();
  }
}

/** Stops the pool's threads (command-line scripts call it so the process can end). */
export async function closeGisPool(): Promise<void> {
  const p = pool;
  pool = null;
  await p?.destroy();
}

/**
 * Starts the pool's first thread without waiting for it (the first /api/health call does this),
 * so the first upload after a start does not wait for a thread to load its modules.
 */
export function warmGisPool(): void {
  if (pool) return;
  getPool()
    .run({ task: 'validate', input: { features: [], options: {} } })
    .catch(() => undefined);
}
