/**
 * The calculation API replays the hand-worked examples of tests/fixtures/worked-examples.ts
 * (arithmetic and IPCC sources are written beside each case there) through the real server,
 * and refuses bad input with 422 naming the field.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { WORKED_EXAMPLES } from '../fixtures/worked-examples';
import { api, DEMO, signIn, type Session } from '../support/http';

let session: Session;
beforeAll(async () => {
  session = await signIn(DEMO.planner);
});

const close = (actual: number, expected: number) => expect(actual).toBeCloseTo(expected, 4);

describe('POST /api/estimates replays the worked examples', () => {
  it('has at least six examples to replay', () => expect(WORKED_EXAMPLES.length).toBeGreaterThanOrEqual(6));

  for (const ex of WORKED_EXAMPLES) {
    it(ex.title, async () => {
      const res = await api('POST', '/api/estimates', { session, body: ex.request });
      expect(res.status, JSON.stringify(res.body)).toBe(200);
      const r = res.body;
      const e = ex.expected;
      close(r.socBeforePerHa, e.socBeforePerHa);
      close(r.socAfterPerHa, e.socAfterPerHa);
      close(r.socChangeTotal, e.socChangeTotal);
      close(r.annualSocChange, e.annualSocChange);
      close(r.biomassChangeTotal, e.biomassChangeTotal);
      close(r.n2oTotal, e.n2oTotal);
      close(r.co2eParts.soil, e.co2eParts.soil);
      close(r.co2eParts.biomass, e.co2eParts.biomass);
      close(r.co2eParts.n2o, e.co2eParts.n2o);
      close(r.co2eTotal, e.co2eTotal);
      for (const p of e.trajectory ?? []) {
        const point = r.trajectory.find((t: { year: number }) => t.year === p.year);
        close(point.co2eCumulative, p.co2eCumulative);
        if (p.socPerHa !== undefined) close(point.socPerHa, p.socPerHa);
      }
      expect(r.factorSet.id).toBe(ex.request.factorSet ?? 'ipcc-2006');
      expect(r.factorSet.version).toBe(1);
      expect(r.cautions.join(' ')).toMatch(/soil sampling/i);
      expect(JSON.stringify(r)).not.toMatch(/null|NaN/);
    });
  }

  it('uses the default set when none is named, and says the shipped tables are not yet confirmed for sign-off', async () => {
    const { factorSet: _omit, ...request } = WORKED_EXAMPLES[0]!.request;
    const res = await api('POST', '/api/estimates', { session, body: request });
    expect(res.status).toBe(200);
    expect(res.body.factorSet).toEqual({ id: 'ipcc-2006', version: 1 });
    expect(res.body.signOffReady).toBe(false);
    expect(res.body.unconfirmedTablesUsed).toContain('soc-ref');
  });

  it('a seeded Monte Carlo range is reproducible and contains the point estimate', async () => {
    const body = { ...WORKED_EXAMPLES[0]!.request, uncertainty: { runs: 500, seed: 42 } };
    const a = await api('POST', '/api/estimates', { session, body });
    const b = await api('POST', '/api/estimates', { session, body });
    expect(a.body.uncertainty).toEqual(b.body.uncertainty);
    expect(a.body.uncertainty.co2eLow).toBeLessThan(a.body.co2eTotal);
    expect(a.body.uncertainty.co2eHigh).toBeGreaterThan(a.body.co2eTotal);
  });
});

describe('POST /api/estimates refuses bad input with 422 naming the field', () => {
  const base = WORKED_EXAMPLES[0]!.request;
  const cases: [string, unknown, (string | number)[]][] = [
    ['an unknown climate region', { ...base, climate: 'sub-arctic-damp' }, ['climate']],
    ['an unknown soil class', { ...base, soils: [{ type: 'loam', fraction: 1 }] }, ['soils', 0, 'type']],
    [
      'fractions that do not sum to 1',
      {
        ...base,
        soils: [
          { type: 'hac', fraction: 0.5 },
          { type: 'sandy', fraction: 0.4 },
        ],
      },
      ['soils'],
    ],
    ['a negative area', { ...base, areaHa: -3 }, ['areaHa']],
    [
      'high input on nominal grassland',
      { ...base, before: { landUse: 'grassland', management: 'nominal', input: 'high' } },
      ['before', 'input'],
    ],
    ['an unknown factor set', { ...base, factorSet: 'no-such-set' }, ['factorSet']],
  ];
  for (const [what, body, path] of cases) {
    it(what, async () => {
      const res = await api('POST', '/api/estimates', { session, body });
      expect(res.status).toBe(422);
      expect(res.body.error.code).toBe('UNPROCESSABLE_CONTENT');
      expect(res.body.error.issues.map((i: { path: unknown }) => i.path)).toContainEqual(path);
    });
  }

  it('a soil class with no reference stock in the region (not applicable in Table 2.3)', async () => {
    // IPCC 2006 Vol 4 Ch 2 Table 2.3 gives no spodic reference stock for tropical regions.
    const res = await api('POST', '/api/estimates', {
      session,
      body: { ...base, climate: 'tropical-moist', soils: [{ type: 'spodic', fraction: 1 }] },
    });
    expect(res.status).toBe(422);
    expect(JSON.stringify(res.body.error.issues)).toMatch(/soils/);
  });
});
