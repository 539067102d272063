/**
 * Integration tier: a fresh test database (migrated and seeded with the demo people), the
 * local SMTP fake and the BUILT app (`astro build` ran before vitest) on loopback ports.
 */
import { execFileSync, type ChildProcess } from 'node:child_process';
import { existsSync, mkdirSync, writeFileSync } from 'node:fs';
import { appEnv, APP_PORT, DIST, SMTP_PORT, TEST_DATABASE_NAME } from './support/env';
import { startAppInstance, startProcess, stopProcess, waitForPort } from './support/processes';

let app: ChildProcess | undefined;
let mail: ChildProcess | undefined;

export async function setup(): Promise<void> {
  if (!existsSync(`${DIST}/server/entry.mjs`)) throw new Error('Build the app first (npm test does: astro build).');
  mkdirSync('.data', { recursive: true });
  const env = appEnv();
  const run = (script: string, ...args: string[]) =>
    execFileSync(process.execPath, ['--import', 'tsx', script, ...args], {
      stdio: 'inherit',
      env: { ...env, SWARDKEEP_DATABASES: `swardkeep,${TEST_DATABASE_NAME}` },
    });
  run('scripts/db.ts', 'start');
  run('scripts/migrate.ts', 'reset');
  run('scripts/seed.ts');
  mail = startProcess(['--import', 'tsx', 'scripts/mail-fake.ts'], env, `.data/test-mail-${SMTP_PORT}.log`);
  await waitForPort(SMTP_PORT, mail);
  // Tests that stop the mail server for a while (the outbox must hold the mail) find it here.
  writeFileSync(`.data/test-mail-${SMTP_PORT}.pid`, String(mail.pid));
  app = await startAppInstance(env, APP_PORT);
}

export async function teardown(): Promise<void> {
  await stopProcess(app);
  await stopProcess(mail);
}
