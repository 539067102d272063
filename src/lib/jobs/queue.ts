/**
 * The job queue: pg-boss, with its own schema (`pgboss`) in our PostgreSQL, so any number of app
 * instances share one queue and one set of cron schedules (each job runs once, on one instance).
 * `npm run migrate` installs the schema and the queues; every instance also makes sure of them
 * when it starts (pg-boss installs under an advisory lock and creates queues with ON CONFLICT DO
 * NOTHING, so concurrent starts do not race). Handlers only call service functions.
 */
import PgBoss from 'pg-boss';
import { config } from '../config';
import { sendDeadlineReminders, sendFollowUpOverdueNotices } from '../services/reminders';
import { checkRegisterChain } from '../services/register';
import { JOB_INFO, JOB_NAMES, type JobName } from './names';
import { logger } from '../log.mjs';

export const JOB_SCHEMA = 'pgboss';

const HANDLERS: Record<JobName, () => Promise<object>> = {
  'deadline-reminders': () => sendDeadlineReminders(),
  'follow-up-overdue': () => sendFollowUpOverdueNotices(),
  'register-check': () => checkRegisterChain(),
};

const QUEUE_OPTIONS = { retryLimit: 3, retryDelay: 60, retryBackoff: true, expireInSeconds: 15 * 60 };

function options(extra: PgBoss.ConstructorOptions = {}): PgBoss.ConstructorOptions {
  return {
    connectionString: config().DATABASE_URL,
    schema: JOB_SCHEMA,
    max: 3,
    application_name: 'swardkeep-jobs',
    ...extra,
  };
}

async function ensureQueues(boss: PgBoss): Promise<void> {
  for (const name of JOB_NAMES) await boss.createQueue(name, { name, ...QUEUE_OPTIONS });
}

/** For `npm run migrate`: installs or upgrades pg-boss's schema and creates the queues, then disconnects. */
export async function installJobQueue(connectionString = config().DATABASE_URL): Promise<void> {
  const boss = new PgBoss(options({ connectionString, supervise: false, schedule: false }));
  boss.on('error', (e) => logger.error({ err: e }, 'job queue error'));
  await boss.start();
  await ensureQueues(boss);
  await boss.stop({ graceful: false, wait: true, close: true });
}

let started: Promise<PgBoss> | null = null;

/** Hooks the server (scripts/serve.mjs) awaits before it exits on SIGINT or SIGTERM. */
function onServerStop(fn: () => Promise<void>): void {
  const key = Symbol.for('swardkeep.stop-hooks');
  const g = globalThis as unknown as Record<symbol, (() => Promise<void>)[]>;
  (g[key] ??= []).push(fn);
}

/** Starts this instance's part of the queue once: schedules (idempotent upserts) and a worker per job. */
export function startJobQueue(): Promise<PgBoss> {
  started ??= (async () => {
    const boss = new PgBoss(options());
    boss.on('error', (e) => logger.error({ err: e }, 'job queue error'));
    await boss.start();
    await ensureQueues(boss);
    for (const name of JOB_NAMES) {
      await boss.schedule(name, JOB_INFO[name].cron, {}, { tz: 'UTC' });
      await boss.work(name, { pollingIntervalSeconds: 2 }, async (jobs) => {
        let out: object = {};
        for (const _ of jobs) out = await HANDLERS[name]();
        return out;
      });
    }
    onServerStop(() => boss.stop({ graceful: true, timeout: 3000, wait: true, close: true }));
    return boss;
  })();
  started.catch((err) => {
    logger.error({ err }, 'job queue did not start');
    started = null;
  });
  return started;
}

/** Queues a run of `name` now (the admin route); returns the job id. */
export async function queueRunNow(name: JobName, requestedBy: string): Promise<string> {
  const boss = await startJobQueue();
  const id = await boss.send(name, { requestedBy });
  if (!id) throw new Error(`the job queue did not accept a run of ${name}`);
  return id;
}

export async function jobRun(name: JobName, id: string) {
  const boss = await startJobQueue();
  const job = await boss.getJobById<{ requestedBy?: string }>(name, id, { includeArchive: true });
  if (!job) return null;
  return {
    id: job.id,
    name: job.name,
    state: job.state,
    createdOn: job.createdOn.toISOString(),
    startedOn: job.startedOn?.toISOString() ?? null,
    completedOn: job.completedOn?.toISOString() ?? null,
    output: job.output ?? null,
  };
}
