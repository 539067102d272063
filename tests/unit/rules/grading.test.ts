/** How a grade is formed (gates first, highest level, no averaging), what reasons say, the schema, the levels and the diff. */
import { describe, expect, it } from 'vitest';
import {
  diffRuleSets,
  gradeProposal,
  holdingWindowYears,
  levelInfo,
  RISK_LEVELS,
  ruleSetDocumentSchema,
  TARROW_SCREENING,
  type RuleSetDocument,
} from '~/lib/rules';
import { facts, holding, OWNER, parcel, region } from './facts-builder';

const REF = { id: 'tarrow-screening', version: 1 };

describe('gates beat averages', () => {
  it('a sliver of sensitive grassland on one parcel of ten sets level 4 although every figure is low', () => {
    const parcels = Array.from({ length: 10 }, (_, i) =>
      parcel({ parcelId: i + 1, reference: `CM-${String(i + 200)}`, areaHa: 10 }),
    );
    parcels[7] = { ...parcels[7]!, sensitive: { share: 0.002, areaHa: 0.02 } };
    const g = gradeProposal(facts({ parcels, totals: { areaHa: 100, socLossPerHa: 1 } }), TARROW_SCREENING, REF);
    expect(g.level).toBe(4);
    expect(g.label).toBe(levelInfo(4).label);
    expect(g.reasons).toHaveLength(1);
    expect(g.reasons[0]!.text).toContain('CM-207');
  });

  it('several level-2 rules do not add up to level 3: the grade is the highest level', () => {
    const g = gradeProposal(
      facts({ totals: { socLossPerHa: 12, co2eTotal: 800 }, budget: { proposalShare: 0.2 } }),
      TARROW_SCREENING,
      REF,
    );
    expect(g.reasons.map((r) => r.rule).sort()).toEqual(['budget-share-10', 'co2e-500', 'soc-loss-10']);
    expect(g.level).toBe(2);
  });

  it('gate reasons come first, then threshold rules in set order', () => {
    const g = gradeProposal(
      facts({
        totals: { socLossPerHa: 30 },
        parcels: [parcel({ sensitive: { share: 0.5, areaHa: 0.75 } })],
        regions: [region({ relativeFallAfter: 0.08, ratioAfter: 0.552 })],
      }),
      TARROW_SCREENING,
      REF,
    );
    expect(g.reasons.map((r) => [r.rule, r.gate])).toEqual([
      ['sensitive-grassland', true],
      ['region-ratio-fall', true],
      ['soc-loss-10', false],
      ['soc-loss-25', false],
    ]);
  });

  it('gates are evaluated first wherever the set lists them', () => {
    const doc = ruleSetDocumentSchema.parse({ ...TARROW_SCREENING, rules: [...TARROW_SCREENING.rules].reverse() });
    const g = gradeProposal(
      facts({ parcels: [parcel({ sensitive: { share: 0.1, areaHa: 0.15 } })], totals: { co2eTotal: 3000 } }),
      doc,
      REF,
    );
    expect(g.level).toBe(4);
    expect(g.reasons[0]!.rule).toBe('sensitive-grassland');
  });
});

describe('reasons', () => {
  it('carry figures and citations and never the holding reference', () => {
    const g = gradeProposal(
      facts({
        parcels: [
          parcel({
            sensitive: { share: 0.25, areaHa: 0.375 },
            flags: { permanentGrassland: true, uncultivated: true, neverTilled: true },
            slope: { steep: { share: 0.4, areaHa: 0.6 } },
          }),
        ],
        holdings: [
          holding({ thisProposalHa: 1.5, earlierHa: 0.8, cumulativeHa: 2.3, earlierReferences: ['PR-2026-0002'] }),
        ],
        totals: { socLossPerHa: 31.4, co2eTotal: 2500 },
        budget: { proposalShare: 0.3 },
        regions: [region({ relativeFallAfter: 0.07, ratioAfter: 0.558 })],
      }),
      TARROW_SCREENING,
      REF,
    );
    expect(g.reasons).toHaveLength(11); // every rule of the set fired
    for (const r of g.reasons) {
      expect(r.text).not.toContain(OWNER);
      expect(r.text).toMatch(/\d/);
      expect(r.citation.length).toBeGreaterThan(10);
    }
    expect(g.reasons.find((r) => r.rule === 'sensitive-grassland')!.text).toContain('0.38 ha');
    expect(g.reasons.find((r) => r.rule === 'soc-loss-25')!.text).toContain('31.4 t C/ha');
    expect(g.reasons.find((r) => r.rule === 'co2e-2000')!.text).toContain('2,500 t CO2e');
    expect(g.reasons.find((r) => r.rule === 'budget-share-25')!.text).toContain('30 %');
    expect(JSON.stringify(g)).not.toContain(OWNER);
  });
});

describe('the rule-set document', () => {
  const clone = (): RuleSetDocument => JSON.parse(JSON.stringify(TARROW_SCREENING));
  it('the shipped set has the rule ids the other parts rely on', () => {
    expect(TARROW_SCREENING.id).toBe('tarrow-screening');
    expect(TARROW_SCREENING.rules.map((r) => r.id)).toEqual([
      'sensitive-grassland',
      'region-ratio-fall',
      'holding-cumulative-2ha',
      'never-tilled',
      'steep-slope',
      'soc-loss-10',
      'soc-loss-25',
      'co2e-500',
      'co2e-2000',
      'budget-share-10',
      'budget-share-25',
    ]);
    expect(holdingWindowYears(TARROW_SCREENING)).toBe(5);
  });
  it('refuses a gate below level 4', () => {
    const d = clone();
    (d.rules[0] as { level: number }).level = 3;
    const r = ruleSetDocumentSchema.safeParse(d);
    expect(r.success).toBe(false);
    expect(r.error!.issues[0]!.message).toMatch(/hard gate/);
  });
  it('refuses a rule id used twice, an unknown kind and a wrong parameter', () => {
    const dup = clone();
    dup.rules[1] = { ...dup.rules[1]!, id: dup.rules[0]!.id };
    expect(ruleSetDocumentSchema.safeParse(dup).error!.issues[0]!.message).toMatch(/used twice/);
    const kind = clone() as unknown as { rules: { kind: string }[] };
    kind.rules[0]!.kind = 'moon-phase';
    expect(ruleSetDocumentSchema.safeParse(kind).success).toBe(false);
    const param = clone() as unknown as { rules: { params: Record<string, unknown> }[] };
    param.rules[2]!.params = { atLeastHa: -1, windowYears: 5 };
    expect(ruleSetDocumentSchema.safeParse(param).success).toBe(false);
  });
});

describe('levels', () => {
  it('four levels, each with its own label and its own shape', () => {
    const infos = RISK_LEVELS.map(levelInfo);
    expect(new Set(infos.map((i) => i.label)).size).toBe(4);
    expect(new Set(infos.map((i) => i.shape)).size).toBe(4);
    expect(() => levelInfo(0)).toThrow(RangeError);
    expect(() => levelInfo(5)).toThrow(RangeError);
  });
});

describe('diff', () => {
  it('shows exactly the changed rule and field, and added and removed rules', () => {
    const b: RuleSetDocument = JSON.parse(JSON.stringify(TARROW_SCREENING));
    const h = b.rules.find((r) => r.id === 'holding-cumulative-2ha')!;
    // Same params with keys in another order: not a change.
    (b.rules.find((r) => r.id === 'co2e-500') as { params: unknown }).params = {
      basis: 'central',
      aboveTonnesCo2e: 500,
    };
    (h as { params: unknown }).params = { atLeastHa: 2, windowYears: 7 };
    b.rules = b.rules.filter((r) => r.id !== 'budget-share-25');
    b.rules.push({ ...b.rules[0]!, id: 'sensitive-any-use' });
    const d = diffRuleSets(TARROW_SCREENING, b);
    expect(d.map((x) => [x.rule, x.presence, x.changed])).toEqual([
      ['holding-cumulative-2ha', 'both', ['params']],
      ['budget-share-25', 'only-a', []],
      ['sensitive-any-use', 'only-b', []],
    ]);
  });
});
