/** Starting and stopping the real servers the integration tests talk to. */
import { spawn, type ChildProcess } from 'node:child_process';
import { openSync } from 'node:fs';
import net from 'node:net';
import { DIST } from './env';

export async function waitForHttp(url: string, child: ChildProcess, timeoutMs = 30_000): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    if (child.exitCode !== null)
      throw new Error(`${url}: the process exited with code ${child.exitCode} before answering`);
    try {
      if ((await fetch(url)).ok) return;
    } catch {
      /* not up yet */
    }
    await new Promise((r) => setTimeout(r, 150));
  }
  throw new Error(`${url} did not answer within ${timeoutMs} ms`);
}

export function startProcess(args: string[], env: NodeJS.ProcessEnv, logFile: string): ChildProcess {
  const log = openSync(logFile, 'a');
  return spawn(process.execPath, args, { env, stdio: ['ignore', log, log] });
}

export async function stopProcess(child: ChildProcess | undefined): Promise<void> {
  if (!child || child.exitCode !== null) return;
  const exited = new Promise((r) => child.once('exit', r));
  child.kill('SIGTERM');
  await Promise.race([exited, new Promise((r) => setTimeout(r, 5000))]);
  if (child.exitCode === null) child.kill('SIGKILL');
}

/** Starts one more app instance on `port` against the test database (multi-instance tests). */
export async function startAppInstance(env: NodeJS.ProcessEnv, port: number): Promise<ChildProcess> {
  const child = startProcess(
    ['--max-semi-space-size=4', `scripts/serve.mjs`],
    { SWARDKEEP_DIST: DIST, ...env },
    `.data/test-app-${port}.log`,
  );
  await waitForHttp(`http://127.0.0.1:${port}/api/health`, child);
  return child;
}

export async function waitForPort(port: number, child: ChildProcess, timeoutMs = 20_000): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    if (child.exitCode !== null) throw new Error(`port ${port}: the process exited with code ${child.exitCode}`);
    const open = await new Promise<boolean>((resolve) => {
      const s = net.connect(port, '127.0.0.1', () => s.end(() => resolve(true)));
      s.on('error', () => resolve(false));
    });
    if (open) return;
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error(`nothing listens on port ${port} after ${timeoutMs} ms`);
}
