/**
 * The assessment answer written in pieces (answer-json.ts) is the same JSON value as
 * JSON.stringify's, the plain path: equality judged the common-practice way, both texts through
 * JSON.parse (RFC 8259 leaves the order of an object's members without meaning, so the order is not compared).
 */
import { describe, expect, it } from 'vitest';
import { IPCC_2006 } from '~/lib/carbon';
import { assessmentAnswerJson, assessmentAnswerPieces } from '~/lib/proposals/answer-json';
import { estimatesAsApi, type ParcelRequest } from '~/lib/proposals/assessment-figures';

const request = (i: number): ParcelRequest =>
  ({
    factorSet: IPCC_2006.id,
    factorSetVersion: IPCC_2006.version,
    climate: 'cool-temperate-moist',
    soils:
      i % 3
        ? [{ type: 'hac', fraction: 1 }]
        : [
            { type: 'lac', fraction: 0.4 },
            { type: 'spodic', fraction: 0.6 },
          ],
    areaHa: 0.5 + i / 3,
    before: { landUse: 'grassland', management: i % 2 ? 'nominal' : 'improved', input: 'medium' },
    after: { landUse: 'cropland', system: 'long-term-cultivated', tillage: 'full', input: 'medium' },
    transitionYears: 20,
    gwp: 'ar5',
    biomass: true,
    n2o: true,
  }) as ParcelRequest;

function answer(n: number) {
  const requests = Array.from({ length: n }, (_, i) => (i % 5 === 4 ? null : request(i)));
  const estimates = estimatesAsApi(requests, IPCC_2006);
  return {
    id: 7,
    proposalId: 3,
    version: 2,
    status: 'draft',
    totals: { areaHa: 12.5, co2eTotal: -0.1, runs: 1000 },
    grade: { level: 2, label: 'Moderate – “review”', reasons: ['Sward never tilled: 2 × 0.5 ha'] },
    signedAt: null,
    findings: undefined,
    parcels: requests.map((r, i) => ({
      parcelId: i + 1,
      reference: `ÉT-${i}`,
      areaHa: r?.areaHa ?? 1,
      part: i % 4 === 0,
      request: r,
      currentState: { source: 'record', note: 'Recorded as pasture (2010).' },
      skipped: undefined,
      problems: r ? [] : ['60 % of the parcel lies outside every unit of the soil map.'],
      estimate: estimates[i],
    })),
  };
}

describe('assessment answer in pieces', () => {
  it('parses to the same value as JSON.stringify, estimates sharing their factors included', () => {
    const a = answer(23);
    // The batch shares one frozen factors array per kind of request: the case the writer reuses.
    expect(a.parcels[1]!.estimate!.factors).toBe(a.parcels[7]!.estimate!.factors);
    expect(Object.isFrozen(a.parcels[1]!.estimate!.factors)).toBe(true);
    expect(JSON.parse(assessmentAnswerJson(a))).toEqual(JSON.parse(JSON.stringify(a)));
  });

  it('cuts pieces of about the size asked for, whose bytes join to the whole UTF-8 text', () => {
    const a = answer(40);
    const pieces = [...assessmentAnswerPieces(a, 4096)];
    expect(pieces.length).toBeGreaterThan(5);
    for (const p of pieces.slice(0, -1)) expect(p.length).toBeGreaterThanOrEqual(4096);
    const text = Buffer.concat(pieces).toString('utf8');
    expect(text).toBe(assessmentAnswerJson(a));
    expect(text).toContain('"reference":"ÉT-3"');
    expect(JSON.parse(text)).toEqual(JSON.parse(JSON.stringify(a)));
  });

  it('writes an answer without parcels and a parcel without an estimate', () => {
    const empty = { id: 1, parcels: [] as Record<string, unknown>[] };
    expect(JSON.parse(assessmentAnswerJson(empty))).toEqual(empty);
    const bare = { parcels: [{ parcelId: 1 }, { parcelId: 2, estimate: null }] };
    expect(JSON.parse(assessmentAnswerJson(bare))).toEqual(bare);
  });
});
