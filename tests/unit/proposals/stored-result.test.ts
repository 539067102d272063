/**
 * The stored (column) form of an assessment result gives back the same JSON value. Equality is
 * judged the common-practice way: both sides through JSON.stringify / JSON.parse, as PostgreSQL's
 * jsonb keeps them (key order is not kept by jsonb, so it is not compared).
 */
import { describe, expect, it } from 'vitest';
import { packResult, packRows, unpackResult, unpackRows } from '~/lib/proposals/stored-result';

const asJson = (v: unknown) => JSON.parse(JSON.stringify(v));

function parcel(i: number) {
  return {
    parcelId: 100 + i,
    reference: `TQ-${i}`,
    areaHa: 1.5 + i / 7,
    part: i % 5 === 0,
    request:
      i % 4 === 3
        ? null
        : {
            factorSet: 'ipcc-2006',
            factorSetVersion: 1,
            climate: 'cool-temperate-moist',
            soils: [
              { type: 'hac', fraction: 0.25 },
              { type: 'lac', fraction: 0.75 },
            ].slice(0, 1 + (i % 2)),
            areaHa: 1.5 + i / 7,
            before: { landUse: 'grassland', management: i % 3 ? 'nominal' : 'improved' },
            after: { landUse: 'cropland' },
            transitionYears: 20,
          },
    figures:
      i % 4 === 3
        ? null
        : {
            socBeforePerHa: 80 + i,
            socAfterPerHa: 55.25 - i / 3,
            co2eTotal: -0 + i * 1e-17,
            co2eParts: { soc: i, biomass: 0.1 },
          },
    currentState: { source: 'record', note: 'From the land-use record.' },
    overlay: { climate: 'cool-temperate-moist', soils: [], flags: i === 2 ? ['Only 80 % covered.'] : [] },
    problems: [],
  };
}

function result(n: number) {
  const parcels = Array.from({ length: n }, (_, i) => parcel(i));
  return {
    totals: { areaHa: 12, runs: 1000, seed: 42, co2eTotal: 123.456 },
    parcels,
    overlayUsed: Object.fromEntries(
      parcels.map((p, i) => [
        p.parcelId,
        [
          {
            kind: 'climate',
            layerVersion: 2,
            coveredShare: 1,
            classes: [{ class: 'cool-temperate-moist', areaHa: p.areaHa, share: 1 }],
          },
          {
            kind: 'slope',
            layerVersion: 1,
            coveredShare: i % 2 ? null : 0.5,
            classes:
              i % 3
                ? []
                : [
                    { class: 'steep', areaHa: 0.2, share: 0.1 },
                    { class: 'flat', areaHa: 1, share: 0.9 },
                  ],
          },
        ],
      ]),
    ),
    grade: { level: 2, reasons: [{ rule: 'x', text: 'y' }] },
    compensationRequest: null,
    facts: {
      proposalReference: 'P-1',
      converts: true,
      parcels: parcels.map((p, i) => ({
        parcelId: p.parcelId,
        ownerRef: i % 2 ? null : 'H1',
        regionKey: 'north',
        slope: i % 2 ? {} : { steep: { share: 0.1, areaHa: 0.2 } },
        flags: { permanentGrassland: i % 3 ? true : null },
      })),
      regions: [],
      holdings: [],
    },
  };
}

describe('stored assessment result', () => {
  it('gives back the same JSON value after a round trip through JSON', () => {
    for (const n of [0, 1, 2, 17]) {
      const r = result(n);
      const stored = asJson(packResult(r));
      expect(asJson(unpackResult(stored))).toEqual(asJson(r));
    }
  });

  it('reads a result stored before the column form as it is', () => {
    const r = asJson(result(3));
    expect(unpackResult(r)).toBe(r);
  });

  it('is smaller than the plain form for many parcels', () => {
    const r = result(500);
    expect(JSON.stringify(packResult(r)).length).toBeLessThan(JSON.stringify(r).length * 0.7);
  });

  it('keeps rows whose keys differ or hold undefined as plain values', () => {
    const rows = [
      { a: 1, b: [{ x: 1 }, { y: 2 }] },
      { a: 2, b: [] },
    ];
    expect(unpackRows(asJson(packRows(rows)))).toEqual(rows);
    expect(() => packRows([{ a: 1 }, { b: 1 }] as never)).toThrow();
    expect(() => packRows([{ a: 1 }, { a: undefined }])).toThrow();
  });
});
