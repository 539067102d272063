/**
 * Assessments through the API: per-parcel figures equal POST /api/estimates, totals and the
 * joint range, blocking problems, the split conversion on one holding, sign-off and mail,
 * re-assessment versions, and reproduction after newer factor and rule sets are published.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { estimateRequestSchema, IPCC_2006, runMonteCarlo, buildPlan } from '~/lib/carbon';
import { testDb, waitForMail } from '../support/db';
import { api, DEMO, signIn, type Session } from '../support/http';
import { uploadFile } from '../support/uploads';
import { allowSignOff, assess, drawParcel, fileProposal, freeBox, rect, submit } from '../support/proposals';

let planner: Session, assessor: Session, admin: Session, board: Session;
beforeAll(async () => {
  [planner, assessor, admin, board] = await Promise.all(
    [DEMO.planner, DEMO.assessor, DEMO.admin, DEMO.board].map((e) => signIn(e)),
  );
});
afterAll(async () => {
  await testDb('app_setting').where({ key: 'assessment.allow-unconfirmed-sign-off' }).delete();
  await testDb.destroy();
});

const relWidth = (t: { co2eLow: number; co2eHigh: number; co2eTotal: number }) =>
  (t.co2eHigh - t.co2eLow) / t.co2eTotal;

describe('figures', () => {
  it('a parcel across the spodic/HAC boundary: fractions worked out by hand, estimate equal to POST /api/estimates', async () => {
    // Demo soil boxes (gis/lib/regions.ts, UTM 28N metres from the grid origin): spodic [-1000,1600,1830,4150],
    // hac [1830,1000,3390,4150]. Rectangle x 1770-1870, y 3300-3400: 60 m of its 100 m width in spodic, 40 m in hac.
    // (The UTM scale factor is constant across 100 m, so the shares on the ellipsoid are the same.)
    const id = await drawParcel(planner, [1770, 3300, 1870, 3400]);
    const p = await fileProposal(planner, [{ parcelId: id }]);
    await submit(planner, p.id);
    const res = await assess(assessor, p.id);
    expect(res.status, JSON.stringify(res.body).slice(0, 500)).toBe(200);
    const a = res.body;
    const parcel = a.parcels[0];
    expect(parcel.request.climate).toBe('cool-temperate-moist');
    const soils = Object.fromEntries(
      parcel.request.soils.map((s: { type: string; fraction: number }) => [s.type, s.fraction]),
    );
    // To 0.5 %: the layer edges are straight between points digitised every 100 m, the parcel's between its corners.
    expect(soils.spodic).toBeCloseTo(0.6, 2);
    expect(soils.hac).toBeCloseTo(0.4, 2);
    expect(parcel.request.before).toEqual({ landUse: 'grassland', management: 'nominal', input: 'medium' });
    expect(parcel.currentState.source).toBe('record');
    const direct = await api('POST', '/api/estimates', { session: assessor, body: parcel.request });
    expect(direct.status).toBe(200);
    expect(parcel.estimate).toEqual(direct.body);
    // Read back later, each parcel's estimate is rebuilt from its stored request with the pinned set: the same.
    expect((await api('GET', `/api/assessments/${a.id}`, { session: board })).body.parcels[0].estimate).toEqual(
      direct.body,
    );
    // One parcel: the total is the parcel.
    expect(a.totals.co2eTotal).toBe(parcel.estimate.co2eTotal);
    expect(a.totals.co2eLow).toBeLessThan(a.totals.co2eTotal);
    expect(a.totals.co2eHigh).toBeGreaterThan(a.totals.co2eTotal);
    // Starting the assessment moved the proposal on.
    expect((await api('GET', `/api/proposals/${p.id}`, { session: planner })).body.state).toBe('in-assessment');
    // The steep slope class (y > 2400, x < 2600 in the demo slope layer) is one of the grade's reasons.
    expect(a.grade.level).toBeGreaterThanOrEqual(3);
    expect(a.grade.reasons.map((r: { rule: string }) => r.rule)).toContain('steep-slope');
    for (const r of a.grade.reasons) expect(r.citation.length).toBeGreaterThan(5);
    // Alternatives side by side; no tillage loses less than full tillage, keeping it as it is loses nothing.
    const alt = Object.fromEntries(a.alternatives.map((x: { key: string }) => [x.key, x]));
    expect(alt.baseline.co2eTotal).toBe(0);
    expect(alt.proposal.co2eTotal).toBeCloseTo(a.totals.co2eTotal, 9);
    expect(alt['no-tillage'].co2eTotal).toBeLessThan(alt.proposal.co2eTotal);
    expect(alt['no-tillage'].differenceFromProposal).toBeLessThan(0);
    expect(alt.share.co2eTotal).toBeCloseTo(alt.proposal.co2eTotal * 0.5, 6);
    // IPCC Tier 1, cool temperate moist, grassland to long-term cultivated cropland: F_LU 0.69 (2006 Vol 4 Ch 5
    // Table 5.5), so 31 % of the mineral stock is lost: inside the 20-60 % band of field studies.
    expect(a.plausibility.lossShare).toBeCloseTo(0.31, 2);
    expect(a.plausibility.inBand).toBe(true);
  });

  it('the total is the sum of the parcels, and the joint range of two parcels is as wide, relatively, as one parcel of their combined area', async () => {
    const [b1, b2, b3] = [await freeBox(100), await freeBox(100), await freeBox(150)];
    const one = await drawParcel(planner, b1);
    const two = await drawParcel(planner, b2);
    const big = await drawParcel(planner, [b3[0], b3[1], b3[0] + 100, b3[1] + 150]);
    const pair = await fileProposal(planner, [{ parcelId: one }, { parcelId: two }]);
    const single = await fileProposal(planner, [{ parcelId: big }]);
    for (const p of [pair, single]) await submit(planner, p.id);
    const a = (await assess(assessor, pair.id)).body;
    const b = (await assess(assessor, single.id)).body;
    const sum = (k: string) =>
      a.parcels.reduce((s: number, p: { estimate: Record<string, number> }) => s + p.estimate[k]!, 0);
    for (const k of ['socChangeTotal', 'biomassChangeTotal', 'n2oTotal', 'co2eTotal'])
      expect(a.totals[k]).toBeCloseTo(sum(k), 9);
    // Same soil and climate: a factor is one uncertain quantity for the whole inventory (IPCC 2006 Vol 1 Ch 3),
    // so doubling the area scales every run and the relative width stays the same.
    expect(relWidth(a.totals)).toBeCloseTo(relWidth(b.totals), 9);
    // Drawing each parcel on its own (the mistake) gives a narrower range: check it is not what we did.
    const req = estimateRequestSchema.parse({ ...a.parcels[0].request });
    const plan = buildPlan(req, IPCC_2006);
    const r1 = runMonteCarlo(plan, a.parcels[0].areaHa, 20, 1000, 11).samples;
    const r2 = runMonteCarlo(plan, a.parcels[1].areaHa, 20, 1000, 12).samples;
    const sorted = r1.map((x, i) => x + r2[i]!).sort((x, y) => x - y);
    const independent = (sorted[974]! - sorted[24]!) / a.totals.co2eTotal;
    expect(relWidth(a.totals)).toBeGreaterThan(independent * 1.2);
  });

  it('a parcel partly outside the soil layer is named, not guessed, and blocks sign-off', async () => {
    // Soil leaves x >= 4940, y >= 2730 uncovered; hac box [4500,2730,4940,4150]: x 4900-5000 is 40 % in, 60 % out.
    const id = await drawParcel(planner, [4900, 3500, 5000, 3600]);
    const p = await fileProposal(planner, [{ parcelId: id }]);
    await submit(planner, p.id);
    const a = (await assess(assessor, p.id)).body;
    expect(a.parcels[0].request).toBeNull();
    expect(a.parcels[0].problems[0]).toMatch(/(59\.\d|60\.\d) % of the parcel lies outside every unit of the soil/);
    expect(a.blocking.join(' ')).toMatch(/(59\.\d|60\.\d) % of the parcel lies outside/);
    const signed = await api('POST', `/api/assessments/${a.id}/sign-off`, {
      session: assessor,
      body: { findings: 'Trying to sign with a gap.', version: a.version },
    });
    expect(signed.status).toBe(409);
  });

  it('a parcel whose record names no usable land use waits for the assessor to choose it, with a reason', async () => {
    const id = await drawParcel(planner, await freeBox(), 'woodland');
    const p = await fileProposal(planner, [{ parcelId: id }]);
    await submit(planner, p.id);
    const first = (await assess(assessor, p.id)).body;
    expect(first.parcels[0].problems[0]).toMatch(/Recorded as woodland/);
    const noReason = await assess(assessor, p.id, {
      version: first.version,
      currentStates: [
        { parcelId: id, state: { landUse: 'grassland', management: 'nominal', input: 'medium' }, reason: '' },
      ],
    });
    expect(noReason.status).toBe(422);
    const chosen = await assess(assessor, p.id, {
      version: first.version,
      currentStates: [
        {
          parcelId: id,
          state: { landUse: 'grassland', management: 'nominal', input: 'medium' },
          reason: 'Site visit 3 March: wood pasture, grazed grass under scattered trees.',
        },
      ],
    });
    expect(chosen.status).toBe(200);
    expect(chosen.body.parcels[0].currentState).toEqual({
      source: 'assessor',
      note: expect.stringMatching(/Site visit/),
    });
    expect(chosen.body.number).toBe(first.number);
    const stale = await assess(assessor, p.id, { version: first.version });
    expect(stale.status).toBe(409);
  });
});

describe('splitting a conversion on one holding', () => {
  it('two proposals on one holding, each under 2 ha, together over it: caught on the second', async () => {
    // Two permanent-grassland fields of holding HLD-T-SPLIT (in grass since the last ploughing in 2008).
    const boxes = [await freeBox(150), await freeBox(150)];
    const features = boxes.map((b, i) => ({
      type: 'Feature',
      properties: { ref: `T-SPLIT-${Date.now()}-${i}`, owner: 'HLD-T-SPLIT', use: 'grassland', till: '2008-04-10' },
      geometry: rect(b),
    }));
    const staged = await uploadFile(planner, 'split.geojson', JSON.stringify({ type: 'FeatureCollection', features }));
    const report = await api('POST', `/api/uploads/${staged.body.id}/validation`, {
      session: planner,
      body: {
        layer: staged.body.layers[0].name,
        mapping: { reference: 'ref', ownerRef: 'owner', landUse: 'use', lastTillage: 'till' },
      },
    });
    expect(report.body.summary.rejected).toBe(0);
    expect((await api('POST', `/api/uploads/${staged.body.id}/save`, { session: planner })).status).toBe(201);
    const ids = await Promise.all(
      features.map(async (f) => Number((await testDb('parcel').where({ reference: f.properties.ref }).first()).id)),
    );
    // Their history: in grass since 2008 (recorded from the farm's records), so permanent grassland
    // (Reg. (EU) 2021/2115 Art. 4(3)(c): not in the crop rotation for 5 years or more).
    for (const id of ids) {
      const ev = await api('POST', `/api/parcels/${id}/events`, {
        session: planner,
        body: {
          date: '2008-05-01',
          kind: 'land-use',
          value: 'grassland',
          evidence: 'Farm records, reseeded after ploughing in April 2008',
        },
      });
      expect(ev.status, JSON.stringify(ev.body)).toBe(201);
    }
    // 1.2 ha on each (100 m x 120 m inside the 150 m squares): each under 2 ha, together 2.4 ha.
    const part = (b: number[]) => rect([b[0]! + 10, b[1]! + 10, b[0]! + 110, b[1]! + 130]);
    const first = await fileProposal(planner, [{ parcelId: ids[0]!, part: part(boxes[0]!) }], {
      title: 'North paddock to barley',
    });
    await submit(planner, first.id);
    const a1 = (await assess(assessor, first.id)).body;
    const holding = (a: { grade: { reasons: { rule: string; text: string }[] } }) =>
      a.grade.reasons.find((r) => r.rule === 'holding-cumulative-2ha');
    expect(holding(a1)).toBeUndefined();
    const second = await fileProposal(planner, [{ parcelId: ids[1]!, part: part(boxes[1]!) }], {
      title: 'South paddock to barley',
    });
    await submit(planner, second.id);
    const a2 = (await assess(assessor, second.id)).body;
    // England EIA (Agriculture) (No.2) Regulations 2006 (SI 2006/2522) reg. 5 / Sch. 1: 2 ha of uncultivated land,
    // sub-threshold projects on one holding added together.
    const reason = holding(a2);
    expect(reason, JSON.stringify(a2.grade)).toBeTruthy();
    expect(a2.grade.level).toBeGreaterThanOrEqual(3);
    expect(reason!.text).toContain(first.reference);
    expect(JSON.stringify(a2)).not.toContain('HLD-T-SPLIT');
  });
});

describe('sign-off, versions and reproduction', () => {
  it('sign-off waits for confirmed tables unless the authority allows it; then freezes, mails the planner and the chair', async () => {
    // The authority's setting as shipped: no sign-off while a table used is unconfirmed (the demo seed allows it).
    await testDb('app_setting').where({ key: 'assessment.allow-unconfirmed-sign-off' }).delete();
    const id = await drawParcel(planner);
    const p = await fileProposal(planner, [{ parcelId: id }]);
    await submit(planner, p.id);
    const a = (await assess(assessor, p.id)).body;
    expect(a.signOffReady).toBe(false);
    const refused = await api('POST', `/api/assessments/${a.id}/sign-off`, {
      session: assessor,
      body: { findings: 'Grassland of ordinary value; the loss is typical.', version: a.version },
    });
    expect(refused.status).toBe(409);
    expect(refused.body.error.message).toMatch(/not yet confirmed by this authority/);
    await allowSignOff();
    const again = (await assess(assessor, p.id, { version: a.version })).body;
    expect(again.blocking).toEqual([]);
    expect(
      (
        await api('POST', `/api/assessments/${a.id}/sign-off`, {
          session: board,
          body: { findings: 'Not my job to sign.', version: again.version },
        })
      ).status,
    ).toBe(403);
    const signed = await api('POST', `/api/assessments/${a.id}/sign-off`, {
      session: assessor,
      body: { findings: 'Grassland of ordinary value; the loss is typical.', version: again.version },
    });
    expect(signed.status, JSON.stringify(signed.body)).toBe(200);
    expect(signed.body).toMatchObject({ status: 'signed', proposalState: 'assessed' });
    await waitForMail(DEMO.planner, new RegExp(`Assessment of ${p.reference} signed off`));
    await waitForMail(DEMO.chair, new RegExp(`Assessment of ${p.reference} signed off`));
    // Frozen: the database refuses any change to a signed assessment.
    await expect(testDb('assessment').where({ id: a.id }).update({ co2e_total: 0 })).rejects.toThrow(
      /signed and frozen/,
    );
    // A re-assessment is a new version; the signed one stays readable.
    const v2 = await assess(assessor, p.id, { reason: 'The applicant sent a soil survey.' });
    expect(v2.body.number).toBe(2);
    const list = (await api('GET', `/api/proposals/${p.id}/assessments`, { session: board })).body.items;
    expect(list.map((x: { number: number; status: string }) => [x.number, x.status])).toEqual([
      [2, 'draft'],
      [1, 'signed'],
    ]);
  });

  it('a signed assessment re-run with its pinned versions gives identical figures after newer factor and rule sets are published', async () => {
    const stamp = Date.now().toString(36);
    const [setId, rulesId] = [`t-repro-${stamp}`, `t-rules-${stamp}`];
    const ok = async (r: Promise<{ status: number; body: unknown }>, status = 200) => {
      const res = await r;
      expect(res.status, JSON.stringify(res.body)).toBe(status);
      return res;
    };
    await ok(
      api('POST', '/api/factor-sets', {
        session: admin,
        body: {
          from: { id: 'ipcc-2006' },
          id: setId,
          title: 'Reproduction test set',
          description: 'A copy',
          reason: 'Reproduction test of pinned versions.',
        },
      }),
      201,
    );
    await ok(api('POST', `/api/factor-sets/${setId}/publish`, { session: admin, body: { note: 'As shipped' } }));
    await ok(
      api('POST', '/api/rule-sets', {
        session: admin,
        body: {
          from: { id: 'tarrow-screening' },
          id: rulesId,
          title: 'Reproduction rules',
          description: 'A copy',
          reason: 'Reproduction test of pinned versions.',
        },
      }),
      201,
    );
    await ok(
      api('POST', `/api/rule-sets/${rulesId}/publish`, { session: admin, body: { note: 'As shipped', revision: 1 } }),
    );
    await allowSignOff();
    const id = await drawParcel(planner);
    const p = await fileProposal(planner, [{ parcelId: id }]);
    await submit(planner, p.id);
    const a = (
      await assess(assessor, p.id, {
        factorSet: setId,
        ruleSet: rulesId,
        overrideReason: 'Testing reproduction with a copy of the set.',
      })
    ).body;
    expect(a.factorSet).toEqual({ id: setId, version: 1 });
    await ok(
      api('POST', `/api/assessments/${a.id}/sign-off`, {
        session: assessor,
        body: { findings: 'Signed for the reproduction test.', version: a.version },
      }),
      200,
    );

    // Newer versions: a changed reference stock, a lower CO2e threshold.
    const socKey = a.parcels[0].estimate.factors
      .find((f: { key: string }) => f.key.startsWith('soc-ref/'))
      .key.split('/')
      .slice(1)
      .join('/');
    await ok(api('POST', `/api/factor-sets/${setId}/draft`, { session: admin }), 201);
    await ok(
      api('PATCH', `/api/factor-sets/${setId}/draft`, {
        session: admin,
        body: { tableKey: 'soc-ref', entryKey: socKey, value: 120, reason: 'Local survey of 2026 soil cores' },
      }),
      204,
    );
    expect(
      (await ok(api('POST', `/api/factor-sets/${setId}/publish`, { session: admin, body: { note: 'Local stock' } })))
        .body,
    ).toEqual({ version: 2 });
    await ok(api('POST', `/api/rule-sets/${rulesId}/draft`, { session: admin }), 201);
    const rule = (
      await api('GET', `/api/rule-sets/${rulesId}?version=draft`, { session: admin })
    ).body.document.rules.find((r: { id: string }) => r.id === 'co2e-500');
    const draftRev = (await api('GET', `/api/rule-sets/${rulesId}?version=draft`, { session: admin })).body.revision;
    await ok(
      api('PATCH', `/api/rule-sets/${rulesId}/draft`, {
        session: admin,
        body: {
          action: 'put',
          ruleId: 'co2e-500',
          rule: { ...rule, params: { ...rule.params, aboveTonnesCo2e: 1 } },
          reason: 'Stricter threshold from board minute 7',
          revision: draftRev,
        },
      }),
      200,
    );
    await ok(
      api('POST', `/api/rule-sets/${rulesId}/publish`, {
        session: admin,
        body: { note: 'Stricter', revision: draftRev + 1 },
      }),
      200,
    );

    const repro = await api('GET', `/api/assessments/${a.id}/reproduce`, { session: board });
    expect(repro.status).toBe(200);
    expect(repro.body).toMatchObject({
      identical: true,
      differences: [],
      factorSet: { id: setId, version: 1 },
      ruleSet: { id: rulesId, version: 1 },
    });
    // A new run takes the newest versions and gives other figures.
    const v2 = (
      await assess(assessor, p.id, {
        factorSet: setId,
        ruleSet: rulesId,
        overrideReason: 'Testing reproduction with a copy of the set.',
        reason: 'New local stock published.',
      })
    ).body;
    expect(v2.factorSet).toEqual({ id: setId, version: 2 });
    expect(v2.totals.co2eTotal).not.toBe(a.totals.co2eTotal);
  });
});

describe('the demo scenario', () => {
  it('seeds proposals in every state a planner and an assessor handle, with every risk level on first start', async () => {
    const rows = await testDb('proposal as p')
      .leftJoin('assessment as a', 'a.proposal_id', 'p.id')
      .whereIn(
        'p.reference',
        testDb('proposal')
          .select('reference')
          .where('applicant_contact', 'like', '%.example')
          .orWhere('applicant_contact', 'like', '%(invented)%'),
      )
      .select('p.state', 'a.grade_level');
    const states = new Set(rows.map((r) => r.state));
    for (const s of ['draft', 'submitted', 'returned', 'in-assessment', 'assessed', 'withdrawn'].filter(
      (x) => x !== 'submitted',
    ))
      expect(states, s).toContain(s);
    expect(new Set(rows.map((r) => r.grade_level).filter(Boolean))).toEqual(new Set([1, 2, 3, 4]));
    // The sensitive-grassland and district-ratio gates, and the split holding, are each shown by one demo proposal.
    const reasons = await testDb.raw(
      `select distinct r->>'rule' as rule from assessment a, json_array_elements(a.result->'grade'->'reasons') r`,
    );
    const fired = reasons.rows.map((r: { rule: string }) => r.rule);
    for (const rule of ['sensitive-grassland', 'region-ratio-fall', 'holding-cumulative-2ha'])
      expect(fired).toContain(rule);
  });
});
