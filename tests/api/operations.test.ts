/**
 * Operations: request ids and JSON request logs without personal data, readiness (database and
 * migrations current) and graceful shutdown that finishes requests in flight.
 */
import { execFileSync, type ChildProcess } from 'node:child_process';
import { readdirSync, readFileSync } from 'node:fs';
import http from 'node:http';
import net from 'node:net';
import pg from 'pg';
import { afterAll, describe, expect, it } from 'vitest';
import { APP_PORT, appEnv, BASE_URL, TEST_DATABASE_URL } from '../support/env';
import { freePort } from '../support/free-port';
import { api, DEMO, DEMO_PASSWORD, signIn } from '../support/http';
import { startAppInstance, stopProcess } from '../support/processes';

type LogLine = Record<string, unknown>;

function logLines(file: string): LogLine[] {
  return readFileSync(file, 'utf8')
    .split('\n')
    .filter((l) => l.startsWith('{'))
    .map((l) => JSON.parse(l) as LogLine);
}

/** The request line of one request id (pino writes synchronously; the line follows the answer closely). */
async function requestLine(file: string, reqId: string): Promise<LogLine> {
  for (let i = 0; i < 40; i++) {
    const found = logLines(file).find((l) => l.reqId === reqId && l.msg === 'request');
    if (found) return found;
    await new Promise((r) => setTimeout(r, 50));
  }
  throw new Error(`no request line for ${reqId} in ${file}`);
}

const APP_LOG = `.data/test-app-${APP_PORT}.log`;
const MIGRATIONS = readdirSync('migrations')
  .filter((f) => f.endsWith('.ts'))
  .sort();
const extra: ChildProcess[] = [];
afterAll(async () => {
  for (const child of extra) await stopProcess(child);
});

describe('request ids and request logs', () => {
  it('echoes a well-formed X-Request-Id and logs one JSON line with route, status and duration', async () => {
    const id = `ops-test-${Date.now()}`;
    // A query string that carries personal data must never reach the log.
    const res = await fetch(`${BASE_URL}/api/register?q=${encodeURIComponent('someone.private@mail.example')}&page=1`, {
      headers: { 'x-request-id': id },
    });
    expect(res.status).toBe(200);
    expect(res.headers.get('x-request-id')).toBe(id);
    const line = await requestLine(APP_LOG, id);
    expect(line).toMatchObject({
      level: 'info',
      service: 'swardkeep',
      msg: 'request',
      method: 'GET',
      route: '/api/register',
      status: 200,
    });
    expect(typeof line.durationMs).toBe('number');
    expect(line.durationMs as number).toBeGreaterThanOrEqual(0);
    expect(new Date(String(line.time)).toString()).not.toBe('Invalid Date');
    // Only these fields: no URL, query, client address, user or headers.
    expect(Object.keys(line).sort()).toEqual([
      'durationMs',
      'level',
      'method',
      'msg',
      'reqId',
      'route',
      'service',
      'status',
      'time',
    ]);
    expect(readFileSync(APP_LOG, 'utf8')).not.toContain('someone.private');
  });

  it('replaces a malformed request id with one of its own', async () => {
    for (const bad of ['short', 'has spaces in it', 'x'.repeat(129), 'semi;colon-0000']) {
      const res = await fetch(`${BASE_URL}/api/regions`, { headers: { 'x-request-id': bad } });
      const echoed = res.headers.get('x-request-id') ?? '';
      expect(echoed).not.toBe(bad);
      expect(echoed).toMatch(/^[0-9a-f-]{36}$/);
    }
    const none = await fetch(`${BASE_URL}/api/regions`);
    expect(none.headers.get('x-request-id')).toMatch(/^[0-9a-f-]{36}$/);
  });

  it('logs route patterns, not paths, and nothing about the signed-in person', async () => {
    const session = await signIn(DEMO.planner);
    const me = await api('GET', '/api/me', { session, headers: { 'x-request-id': `ops-me-${Date.now()}` } });
    expect(me.status).toBe(200);
    const entry = await api('GET', '/api/register/1', { headers: { 'x-request-id': `ops-seq-${Date.now()}` } });
    expect(entry.status).toBe(200);
    const seqLine = await requestLine(APP_LOG, entry.headers.get('x-request-id')!);
    expect(seqLine.route).toBe('/api/register/[seq]');
    const meLine = await requestLine(APP_LOG, me.headers.get('x-request-id')!);
    expect(meLine.route).toBe('/api/me');
    const log = readFileSync(APP_LOG, 'utf8');
    expect(log).not.toContain(DEMO.planner);
    expect(log).not.toContain(DEMO_PASSWORD);
    expect(log).not.toMatch(/"(remoteAddress|ip|url|cookie|email)"/);
  });
});

describe('readiness', () => {
  it('answers 200 with the migration count when the schema is current', async () => {
    const res = await api('GET', '/api/ready');
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ ready: true, database: true, migrations: { applied: MIGRATIONS.length, pending: 0 } });
    expect(res.headers.get('cache-control')).toBe('no-store');
  });

  it('answers 503 with the reason while a migration is pending, 200 once it is applied', async () => {
    const scratch = 'swardkeep_test_ready';
    const adminUrl = new URL(TEST_DATABASE_URL);
    adminUrl.pathname = '/postgres';
    const admin = new pg.Client({ connectionString: adminUrl.toString() });
    await admin.connect();
    await admin.query(`drop database if exists ${scratch} with (force)`);
    await admin.query(`create database ${scratch}`);
    const url = new URL(TEST_DATABASE_URL);
    url.pathname = `/${scratch}`;
    const client = new pg.Client({ connectionString: url.toString() });
    await client.connect();
    try {
      // A database migrated by this checkout, whose bookkeeping then forgets the last migration.
      execFileSync(process.execPath, ['--import', 'tsx', 'scripts/migrate.ts', 'latest'], {
        env: { ...appEnv(), DATABASE_URL: url.toString() },
        stdio: 'ignore',
      });
      await client.query('delete from knex_migrations where name = $1', [MIGRATIONS.at(-1)]);
      const port = await freePort();
      const child = await startAppInstance(
        { ...appEnv(port), DATABASE_URL: url.toString(), MAIL_WORKER: 'off', JOB_QUEUE: 'off' },
        port,
      );
      extra.push(child);
      const base = `http://127.0.0.1:${port}`;
      const pending = await api('GET', '/api/ready', { base });
      expect(pending.status).toBe(503);
      expect(pending.body.error.code).toBe('SERVICE_UNAVAILABLE');
      expect(pending.body.error.message).toContain('1 migration(s) pending');
      expect(pending.body.error.message).toContain(MIGRATIONS.at(-1));
      // Liveness is not readiness: the process and database are fine.
      expect((await api('GET', '/api/health', { base })).status).toBe(200);

      await client.query('update knex_migrations_lock set is_locked = 1');
      await client.query('insert into knex_migrations (name, batch, migration_time) values ($1, 2, now())', [
        MIGRATIONS.at(-1),
      ]);
      const running = await api('GET', '/api/ready', { base });
      expect(running.status).toBe(503);
      expect(running.body.error.message).toContain('a migration is running');

      await client.query('update knex_migrations_lock set is_locked = 0');
      const ready = await api('GET', '/api/ready', { base });
      expect(ready.status).toBe(200);
      expect(ready.body.migrations).toEqual({ applied: MIGRATIONS.length, pending: 0 });
      await stopProcess(child);
    } finally {
      await client.end();
      await admin.query(`drop database if exists ${scratch} with (force)`);
      await admin.end();
    }
  });
});

describe('graceful shutdown', () => {
  it('on SIGTERM refuses new connections, finishes the request in flight and exits 0', async () => {
    const port = await freePort();
    const logFile = `.data/test-app-${port}.log`;
    const child = await startAppInstance({ ...appEnv(port), SHUTDOWN_GRACE_MS: '10000' }, port);
    extra.push(child);
    const base = `http://127.0.0.1:${port}`;
    // Starts the job queue and mail worker, whose stop hooks then run.
    expect((await api('GET', '/api/health', { base })).status).toBe(200);
    const exited = new Promise<number | null>((resolve) => child.once('exit', (code) => resolve(code)));

    let refused: boolean | null = null;
    // A slow client: a sign-in whose body arrives in two parts, with the signal in between.
    const body = JSON.stringify({ email: DEMO.assessor, password: DEMO_PASSWORD });
    const answer = new Promise<{ status: number; text: string }>((resolve, reject) => {
      const req = http.request(
        {
          host: '127.0.0.1',
          port,
          method: 'POST',
          path: '/api/auth/sign-in/email',
          headers: { origin: base, 'content-type': 'application/json', 'content-length': Buffer.byteLength(body) },
        },
        (res) => {
          let text = '';
          res.setEncoding('utf8');
          res.on('data', (c) => (text += c));
          res.on('end', () => resolve({ status: res.statusCode ?? 0, text }));
        },
      );
      req.on('error', reject);
      req.write(body.slice(0, 10));
      setTimeout(async () => {
        child.kill('SIGTERM');
        // Once the server says it is shutting down, a new connection is refused while the old request is still open.
        for (let i = 0; i < 200 && !logLines(logFile).some((l) => String(l.msg).startsWith('shutting down')); i++)
          await new Promise((r) => setTimeout(r, 50));
        const probe = net.connect(port, '127.0.0.1');
        probe.on('connect', () => {
          refused = false;
          probe.destroy();
        });
        probe.on('error', (e: NodeJS.ErrnoException) => (refused = e.code === 'ECONNREFUSED'));
        setTimeout(() => req.end(body.slice(10)), 300);
      }, 1000);
    });

    const done = await answer;
    expect(refused).toBe(true);
    expect(done.status).toBe(200);
    expect(JSON.parse(done.text).user.email).toBe(DEMO.assessor);
    expect(await exited).toBe(0);
    const lines = logLines(logFile);
    const start = lines.findLastIndex((l) => String(l.msg).startsWith('shutting down'));
    expect(start).toBeGreaterThanOrEqual(0);
    expect(lines[start]).toMatchObject({ signal: 'SIGTERM' });
    const after = lines.slice(start);
    expect(after.some((l) => l.msg === 'request' && l.route === '/api/auth/[...all]' && l.status === 200)).toBe(true);
    expect(after.at(-1)).toMatchObject({ msg: 'stopped', cutOff: false });
    expect(after.some((l) => l.level === 'error')).toBe(false);
  });
});
