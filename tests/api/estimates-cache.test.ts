/**
 * Factor-set versions are kept in each instance (by set, version and confirmations), but what is
 * current is read from PostgreSQL on every estimate: a table confirmed through one instance is
 * confirmed at once in the estimates of another that had kept the version before.
 */
import type { ChildProcess } from 'node:child_process';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { testDb } from '../support/db';
import { appEnv, BASE_URL, SECOND_APP_PORT } from '../support/env';
import { api, DEMO, signIn, type Session } from '../support/http';
import { startAppInstance, stopProcess } from '../support/processes';

const SECOND = `http://127.0.0.1:${SECOND_APP_PORT}`;
// Nominal grassland to full-tillage cropland (IPCC 2006 Vol 4 Ch 5-6 tables; the request shape of the estimate tests).
const BODY = {
  factorSet: 'ipcc-2006',
  climate: 'cool-temperate-moist',
  soils: [{ type: 'hac', fraction: 1 }],
  areaHa: 2,
  before: { landUse: 'grassland', management: 'nominal', input: 'medium' },
  after: { landUse: 'cropland', system: 'long-term-cultivated', tillage: 'full', input: 'medium' },
  transitionYears: 20,
  gwp: 'ar5',
  biomass: true,
  n2o: true,
};

let planner: Session;
let admin: Session;
let second: ChildProcess;
let confirmed: { set_id: string; version: number; table_key: string } | null = null;
beforeAll(async () => {
  [planner, admin] = await Promise.all([signIn(DEMO.planner), signIn(DEMO.admin)]);
  second = await startAppInstance(
    { ...appEnv(SECOND_APP_PORT), MAIL_WORKER: 'off', JOB_QUEUE: 'off' },
    SECOND_APP_PORT,
  );
});
afterAll(async () => {
  if (confirmed) await testDb('factor_table_confirmation').where(confirmed).delete();
  await stopProcess(second);
  await testDb.destroy();
});

describe('factor sets kept per instance', () => {
  it('a confirmation made through instance A shows in the next estimate of instance B', async () => {
    const planner2 = await signIn(DEMO.planner, undefined, SECOND);
    const before = await api('POST', '/api/estimates', { session: planner2, base: SECOND, body: BODY });
    expect(before.status).toBe(200);
    const open = before.body.unconfirmedTablesUsed as string[];
    const used = [...new Set((before.body.factors as { key: string }[]).map((f) => f.key.split('/')[0]))];
    expect(used.length).toBeGreaterThan(0);
    // A table the estimate used and this authority has not confirmed yet (else: unconfirm one for the test).
    let table = open[0];
    const version = before.body.factorSet.version as number;
    if (!table) {
      const row = await testDb('factor_table_confirmation').where({ set_id: 'ipcc-2006', version }).first();
      expect(row).toBeTruthy();
      await testDb('factor_table_confirmation')
        .where({ set_id: 'ipcc-2006', version, table_key: row.table_key })
        .delete();
      table = row.table_key as string;
    }
    const same = await api('POST', '/api/estimates', { session: planner2, base: SECOND, body: BODY });
    expect(same.body.unconfirmedTablesUsed).toContain(table);
    const done = await api('POST', `/api/factor-sets/ipcc-2006/versions/${version}/confirmations`, {
      session: admin,
      body: { tableKey: table, document: '2006 IPCC Guidelines, Vol 4', page: '5.17' },
    });
    expect(done.status).toBe(204);
    confirmed = { set_id: 'ipcc-2006', version, table_key: table! };
    for (const [base, s] of [
      [SECOND, planner2],
      [BASE_URL, planner],
    ] as const) {
      const after = await api('POST', '/api/estimates', { session: s, base, body: BODY });
      expect(after.status).toBe(200);
      expect(after.body.unconfirmedTablesUsed).not.toContain(table);
      expect(after.body.co2eTotal).toBe(before.body.co2eTotal);
    }
  });
});
