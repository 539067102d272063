/**
 * Grades a proposal against a rule set (pure). Hard gates are evaluated first: one that fires
 * sets the top level whatever else holds, and nothing averages it away. Then the threshold
 * rules. The grade is the highest level any fired rule gives (level 1 when none fires); every
 * fired rule gives a reason in plain words with its figures and citation. Rules that could not
 * be decided for want of data (no reference ratio, no budget) are listed as `undecided`.
 */
import type { Grade, GradeFacts, GradeReason } from './facts';
import { levelInfo, type RiskLevel } from './levels';
import { evaluateKind, type RuleKind, type RuleParams } from './rule-kinds';
import { citationText, type Rule, type RuleSetDocument } from './schema';

export type RuleSetRef = { id: string; version: number };

export function gradeProposal(facts: GradeFacts, doc: RuleSetDocument, ref: RuleSetRef): Grade {
  const ordered = [...doc.rules.filter((r) => r.gate), ...doc.rules.filter((r) => !r.gate)];
  const reasons: GradeReason[] = [];
  const undecided: NonNullable<Grade['undecided']> = [];
  for (const rule of ordered) {
    const result = evaluateKind(rule.kind, rule.params as RuleParams<RuleKind>, facts);
    if (result.fired)
      reasons.push({
        rule: rule.id,
        citation: citationText(rule),
        text: result.text,
        level: rule.gate ? 4 : rule.level,
        gate: rule.gate,
      });
    else if (result.undecided) undecided.push({ rule: rule.id, citation: citationText(rule), text: result.undecided });
  }
  const level = reasons.reduce<RiskLevel>((top, r) => (r.level > top ? r.level : top), 1);
  return { level, label: levelInfo(level).label, reasons, ruleSet: { id: ref.id, version: ref.version }, undecided };
}

/** The look-back window (years) of the set's holding rule, for gathering earlier proposals; null when the set has none. */
export function holdingWindowYears(doc: RuleSetDocument): number | null {
  const windows = doc.rules
    .filter((r): r is Extract<Rule, { kind: 'holding-cumulative-area' }> => r.kind === 'holding-cumulative-area')
    .map((r) => r.params.windowYears);
  return windows.length ? Math.max(...windows) : null;
}
