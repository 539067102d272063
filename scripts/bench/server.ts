/**
 * The built app started for a benchmark (scripts/serve.mjs on BENCH_PORT, against DATABASE_URL),
 * with the small client helpers every benchmark step uses: sign-in, JSON calls, percentiles, the
 * server's memory from /proc.
 */
import { spawn } from 'node:child_process';
import { readFileSync, writeFileSync } from 'node:fs';
import { createInterface } from 'node:readline';

export const PORT = Number(process.env.BENCH_PORT ?? 4395);
export const BASE = `http://127.0.0.1:${PORT}`;

/** Parts named in BENCH_SKIP (comma or space separated) are left out. */
export const skipped = (part: string) => (process.env.BENCH_SKIP ?? '').split(/[\s,]+/).includes(part);

/** BENCH_CPU_PROF=<folder>: the server writes a V8 CPU profile there when it stops (node --cpu-prof). */
export function startServer() {
  const prof = process.env.BENCH_CPU_PROF ? ['--cpu-prof', `--cpu-prof-dir=${process.env.BENCH_CPU_PROF}`] : [];
  // BENCH_NODE_FLAGS: the server's Node flags, by default those of scripts/start.sh.
  const flags = (process.env.BENCH_NODE_FLAGS ?? '--max-semi-space-size=4').split(' ').filter(Boolean);
  const server = spawn(process.execPath, [...prof, ...flags, `scripts/serve.mjs`], {
    env: {
      ...process.env,
      NODE_ENV: 'production',
      HOST: '127.0.0.1',
      PORT: String(PORT),
      BETTER_AUTH_URL: BASE,
      MAIL_WORKER: 'off',
      AUTH_SIGNIN_MAX: '1000',
    },
    stdio: ['ignore', 'pipe', 'inherit'],
  });
  // The request log goes on to our stdout; each request line's duration is kept by request id (see `logged`).
  server.stdout!.pipe(process.stdout);
  createInterface({ input: server.stdout! }).on('line', (line) => {
    const m = /"reqId":"([^"]+)".*"durationMs":([\d.]+)/.exec(line);
    if (!m) return;
    durations.set(m[1]!, Number(m[2]));
    waiters.get(m[1]!)?.();
  });
  serverPid = server.pid;
  const vm = (key: 'VmHWM' | 'VmRSS') =>
    Number(new RegExp(`${key}:\\s+(\\d+)`).exec(readFileSync(`/proc/${server.pid}/status`, 'utf8'))![1]) / 1024;
  /** Resets the peak (VmHWM) to the current RSS (Linux clear_refs "5"), so a later peak belongs to one step. */
  const resetPeak = () => writeFileSync(`/proc/${server.pid}/clear_refs`, '5');
  async function up(): Promise<void> {
    for (let i = 0; i < 150; i++) {
      if (server.exitCode !== null) throw new Error('the server exited');
      if (
        await fetch(`${BASE}/api/health`).then(
          (r) => r.ok,
          () => false,
        )
      )
        return;
      await new Promise((r) => setTimeout(r, 200));
    }
    throw new Error('the server did not start');
  }
  return { server, vm, resetPeak, up, stop: () => server.kill('SIGTERM') };
}

let serverPid: number | undefined;

/**
 * CPU time the server process has used so far (all its threads: the main thread, compression and
 * garbage collection; user + system, /proc/<pid>/stat fields 14 and 15 in ticks of 10 ms), in ms:
 * less moved by other work on the machine than elapsed time.
 */
export function serverCpuMs(): number {
  if (serverPid === undefined) return NaN;
  const fields = readFileSync(`/proc/${serverPid}/stat`, 'utf8').split(') ')[1]!.split(' ');
  return (Number(fields[11]) + Number(fields[12])) * 10;
}

const durations = new Map<string, number>();
const waiters = new Map<string, () => void>();

/**
 * The server's own time for a request sent with `X-Request-Id: reqId`: from its arrival to the
 * close of the answer after the last byte was written (`durationMs` of scripts/serve.mjs's
 * request log line), or NaN when no line came within 5 s.
 */
export async function logged(reqId: string): Promise<number> {
  if (!durations.has(reqId))
    await new Promise<void>((resolve) => {
      const t = setTimeout(resolve, 5000);
      waiters.set(reqId, () => {
        clearTimeout(t);
        resolve();
      });
    });
  waiters.delete(reqId);
  return durations.get(reqId) ?? NaN;
}

export async function session(email: string): Promise<string> {
  const r = await fetch(`${BASE}/api/auth/sign-in/email`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', origin: BASE },
    body: JSON.stringify({ email, password: 'meadow-lark-2026' }),
  });
  if (!r.ok) throw new Error(`sign-in ${email}: ${r.status}`);
  return r.headers
    .getSetCookie()
    .map((c) => c.split(';')[0])
    .join('; ');
}

export async function call<T>(
  cookie: string,
  method: string,
  path: string,
  body?: unknown,
): Promise<{ data: T; ms: number; headers: Headers; bytes: number }> {
  const t0 = performance.now();
  const isForm = body instanceof FormData;
  const r = await fetch(`${BASE}${path}`, {
    method,
    headers: { cookie, origin: BASE, ...(body && !isForm ? { 'content-type': 'application/json' } : {}) },
    body: isForm ? body : body ? JSON.stringify(body) : undefined,
  });
  const text = await r.text();
  if (!r.ok) throw new Error(`${method} ${path}: ${r.status} ${text.slice(0, 300)}`);
  return { data: text ? JSON.parse(text) : null, ms: performance.now() - t0, headers: r.headers, bytes: text.length };
}

export const pct = (xs: number[], p: number) =>
  [...xs].sort((a, b) => a - b)[Math.min(xs.length - 1, Math.ceil((p / 100) * xs.length) - 1)]!;
export const s = (ms: number) => `${(ms / 1000).toFixed(2)} s`;
