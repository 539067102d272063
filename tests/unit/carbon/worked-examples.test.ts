import { describe, expect, it } from 'vitest';
import { WORKED_EXAMPLES } from '../../fixtures/worked-examples';
import { builtInFactorSet, estimateLandUseChange, estimateRequestSchema, estimateResultSchema } from '~/lib/carbon';

// Hand-worked examples: the arithmetic and the source of every value are written beside
// each case in tests/fixtures/worked-examples.ts (2006 IPCC Guidelines Vol 4 tables; values
// from memory in ipcc-tier1.md unless marked read there).

const close = (actual: number, expected: number) => expect(actual).toBeCloseTo(expected, 5);

describe('hand-worked examples (tests/fixtures/worked-examples.ts)', () => {
  it('cover loss and gain, every factor regime, multi-soil, organic soil, N2O on/off and each GWP set', () => {
    const reqs = WORKED_EXAMPLES.map((w) => estimateRequestSchema.parse(w.request));
    expect(WORKED_EXAMPLES.length).toBeGreaterThanOrEqual(8);
    expect(WORKED_EXAMPLES.some((w) => w.expected.co2eTotal > 0)).toBe(true);
    expect(WORKED_EXAMPLES.some((w) => w.expected.co2eTotal < 0)).toBe(true);
    expect(new Set(reqs.map((r) => r.gwp))).toEqual(new Set(['ar4', 'ar5', 'ar6']));
    for (const c of [
      'cool-temperate-moist',
      'cool-temperate-dry',
      'tropical-moist',
      'tropical-dry',
      'tropical-montane',
      'boreal-moist',
    ])
      expect(reqs.some((r) => r.climate === c)).toBe(true);
    expect(reqs.some((r) => r.soils.length > 1)).toBe(true);
    expect(reqs.some((r) => r.soils.some((s) => s.type === 'organic'))).toBe(true);
    expect(reqs.some((r) => !r.n2o) && reqs.some((r) => r.n2o && r.before.landUse === 'grassland')).toBe(true);
  });

  for (const w of WORKED_EXAMPLES) {
    it(`${w.id}: ${w.title}`, () => {
      const req = estimateRequestSchema.parse(w.request);
      const set = builtInFactorSet(req.factorSet!)!;
      const r = estimateLandUseChange(req, set);
      const e = w.expected;
      close(r.socBeforePerHa, e.socBeforePerHa);
      close(r.socAfterPerHa, e.socAfterPerHa);
      close(r.socChangeTotal, e.socChangeTotal);
      close(r.annualSocChange, e.annualSocChange);
      close(r.biomassChangeTotal, e.biomassChangeTotal);
      expect(r.n2oTotal).toBeCloseTo(e.n2oTotal, 7);
      close(r.co2eParts.soil, e.co2eParts.soil);
      close(r.co2eParts.biomass, e.co2eParts.biomass);
      close(r.co2eParts.n2o, e.co2eParts.n2o);
      close(r.co2eTotal, e.co2eTotal);
      close(r.co2eTotal, r.co2eParts.soil + r.co2eParts.biomass + r.co2eParts.n2o);
      for (const p of e.trajectory ?? []) {
        const point = r.trajectory.find((t) => t.year === p.year)!;
        close(point.co2eCumulative, p.co2eCumulative);
        if (p.socPerHa !== undefined) close(point.socPerHa, p.socPerHa);
      }
      // Shape of the response: years 0..D+10, set named, schema-valid.
      expect(r.trajectory.map((t) => t.year)).toEqual(Array.from({ length: req.transitionYears + 11 }, (_, i) => i));
      close(r.trajectory[req.transitionYears]!.co2eCumulative, r.co2eTotal);
      expect(r.factorSet).toEqual({ id: set.id, version: set.version });
      expect(estimateResultSchema.safeParse(r).success).toBe(true);
    });
  }
});

describe('result details', () => {
  const byId = (id: string) => WORKED_EXAMPLES.find((w) => w.id === id)!;
  const run = (id: string) => {
    const req = estimateRequestSchema.parse(byId(id).request);
    return estimateLandUseChange(req, builtInFactorSet(req.factorSet!)!);
  };

  it('lists every value used with its source and status (we1)', () => {
    const keys = run('we1-warm-temperate-moist-loss-ar5').factors.map((f) => f.key);
    expect(keys).toEqual(
      expect.arrayContaining([
        'soc-ref/warm-temperate-moist/hac',
        'cropland-stock-factors/f-lu/long-term-cultivated/temperate-boreal-moist',
        'grassland-stock-factors/f-mg/nominal/temperate-boreal-moist',
        'grassland-biomass/total/warm-temperate-wet',
        'carbon-fraction/herbaceous',
        'cropland-biomass/annual/all',
        'n2o-mineralisation/cn-ratio/land-use-change',
        'n2o-mineralisation/ef1/wet',
        'n2o-mineralisation/frac-leach',
        'n2o-mineralisation/ef5',
        'gwp/ar5/n2o',
        'constant/c-to-co2',
        'constant/n2o-n-to-n2o',
      ]),
    );
    // The peak above-ground column of Table 6.4 is never the one used.
    expect(keys.some((k) => k.includes('above-ground'))).toBe(false);
  });

  it('names each unchecked value once, in words and grouped by table, and keeps the three standing cautions', () => {
    const r = run('we1-warm-temperate-moist-loss-ar5');
    expect(r.cautions.slice(0, 3).join(' ')).toMatch(
      /Tier 1.*site survey or soil sampling.*local law and to licensed professionals/s,
    );
    const unchecked = r.cautions.filter((c) => c.startsWith('Values not yet checked'));
    expect(unchecked).toHaveLength(1);
    for (const f of r.factors.filter((x) => x.status === 'unconfirmed')) {
      expect(unchecked[0]).toContain(`${f.role} `);
      expect(unchecked[0]).toContain(f.source.table);
    }
    // Machine keys stay off the screen.
    for (const f of r.factors) expect(unchecked[0]).not.toContain(f.key);
    // Confirmed values (C:N ratio read in S2, GWP cross-checked in S6) are not listed.
    const cn = r.factors.find((f) => f.key.includes('cn-ratio/land-use-change'))!;
    expect(cn.status).toBe('confirmed');
    expect(unchecked[0]).not.toContain(cn.role);
  });

  it('states the organic-soil assumption and keeps emitting after D (we5)', () => {
    const r = run('we5-organic-soil');
    expect(r.cautions.some((c) => /drained under both/.test(c))).toBe(true);
    expect(r.trajectory[30]!.co2eCumulative).toBeGreaterThan(r.trajectory[20]!.co2eCumulative);
  });

  it('uses the set-aside F_LU for annual cropland converted to grassland (we7)', () => {
    const r = run('we7-cropland-back-to-grassland-ar6');
    expect(r.factors.map((f) => f.key)).toContain('cropland-stock-factors/f-lu/set-aside/temperate-boreal-dry');
    expect(r.factors.map((f) => f.key)).not.toContain(
      'grassland-stock-factors/f-lu/all-permanent/temperate-boreal-dry',
    );
  });

  it('mineral trajectory is flat after D when there is no organic soil', () => {
    const r = run('we2-cool-temperate-moist-multi-soil-ar4');
    for (const t of r.trajectory.slice(20)) {
      close(t.socPerHa, r.socAfterPerHa);
      close(t.co2eCumulative, r.co2eTotal);
    }
  });
});
