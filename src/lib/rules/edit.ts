/** Pure changes to a rule-set document: put (add or replace) one rule, remove one, re-identify a copy. */
import { z } from 'zod';
import { ruleSetDocumentSchema, type Rule, type RuleSetDocument } from './schema';

export type RuleChange = { action: 'put'; ruleId: string; rule: unknown } | { action: 'remove'; ruleId: string };

export class RuleEditError extends Error {
  constructor(
    message: string,
    readonly issues: { path: (string | number)[]; message: string }[],
  ) {
    super(message);
  }
}

/** The document after the change, validated as a whole; throws RuleEditError naming the field. */
export function withRuleChange(
  doc: RuleSetDocument,
  change: RuleChange,
): { document: RuleSetDocument; before: Rule | null; after: Rule | null } {
  const index = doc.rules.findIndex((r) => r.id === change.ruleId);
  const before = index >= 0 ? doc.rules[index]! : null;
  let rules: unknown[];
  if (change.action === 'remove') {
    if (!before)
      throw new RuleEditError(`There is no rule "${change.ruleId}" in this draft.`, [
        { path: ['ruleId'], message: 'Unknown rule.' },
      ]);
    rules = doc.rules.filter((_, i) => i !== index);
  } else {
    const id = (change.rule as { id?: unknown } | null)?.id;
    if (id !== change.ruleId)
      throw new RuleEditError(`The rule's id must be "${change.ruleId}".`, [
        { path: ['rule', 'id'], message: 'Must equal ruleId.' },
      ]);
    rules = index >= 0 ? doc.rules.map((r, i) => (i === index ? change.rule : r)) : [...doc.rules, change.rule];
  }
  const parsed = ruleSetDocumentSchema.safeParse({ ...doc, rules });
  if (!parsed.success) {
    const issues = parsed.error.issues.map((i) => ({
      path: rulePath(i.path, index >= 0 ? index : doc.rules.length),
      message: i.message,
    }));
    throw new RuleEditError(
      `The rule is not valid: ${issues.map((i) => `${i.path.join('.')}: ${i.message}`).join('; ')}`,
      issues,
    );
  }
  const after = change.action === 'remove' ? null : parsed.data.rules.find((r) => r.id === change.ruleId)!;
  return { document: parsed.data, before, after };
}

/** ["rules", 3, "params", "atLeastHa"] → ["rule", "params", "atLeastHa"] for the edited rule. */
function rulePath(path: PropertyKey[], index: number): (string | number)[] {
  const p = path.map((x) => (typeof x === 'symbol' ? String(x) : x));
  if (p[0] === 'rules' && p[1] === index) return ['rule', ...p.slice(2)];
  return p;
}

export function cloneRuleSetDocument(
  doc: RuleSetDocument,
  id: string,
  title: string,
  description: string,
): RuleSetDocument {
  return ruleSetDocumentSchema.parse({ ...doc, id, version: 1, title, description });
}

export const ruleChangeSchema = z.discriminatedUnion('action', [
  z.object({ action: z.literal('put'), ruleId: z.string().min(1).max(60), rule: z.record(z.string(), z.unknown()) }),
  z.object({ action: z.literal('remove'), ruleId: z.string().min(1).max(60) }),
]);
