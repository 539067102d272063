/**
 * Two app instances on one database, as behind a load balancer: a session made on one is
 * honoured by the other, and the sign-in rate limit counts across both (it lives in PostgreSQL).
 */
import type { ChildProcess } from 'node:child_process';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { appEnv, BASE_URL, SECOND_APP_PORT } from '../support/env';
import { api, DEMO, signIn } from '../support/http';
import { startAppInstance, stopProcess } from '../support/processes';

const SECOND_PORT = SECOND_APP_PORT;
const SECOND = `http://127.0.0.1:${SECOND_PORT}`;
let second: ChildProcess;

beforeAll(async () => {
  // The second instance applies a strict sign-in limit; counters are shared through the database.
  second = await startAppInstance(
    { ...appEnv(SECOND_PORT), AUTH_SIGNIN_MAX: '3', AUTH_SIGNIN_WINDOW_S: '60', MAIL_WORKER: 'off' },
    SECOND_PORT,
  );
});
afterAll(() => stopProcess(second));

describe('several stateless instances', () => {
  it('a session created on instance A works on instance B', async () => {
    const session = await signIn(DEMO.assessor, undefined, BASE_URL);
    const me = await api('GET', '/api/me', { session, base: SECOND });
    expect(me.status).toBe(200);
    expect(me.body.email).toBe(DEMO.assessor);
  });

  it('repeated failed sign-ins are rate-limited, and the limit also stops the right password', async () => {
    let limited = false;
    for (let i = 0; i < 8 && !limited; i++) {
      const res = await api('POST', '/api/auth/sign-in/email', {
        base: SECOND,
        body: { email: DEMO.board, password: `guess-${i}-wrong` },
      });
      expect([401, 429]).toContain(res.status);
      limited = res.status === 429;
    }
    expect(limited).toBe(true);
    const right = await api('POST', '/api/auth/sign-in/email', {
      base: SECOND,
      body: { email: DEMO.board, password: 'meadow-lark-2026' },
    });
    expect(right.status).toBe(429);
  });
});
