/** What differs between two rule-set documents, rule by rule (pure). */
import canonicalize from 'canonicalize';
import type { Rule, RuleSetDocument } from './schema';

export type RuleField = 'title' | 'kind' | 'params' | 'level' | 'gate' | 'citation' | 'explanation' | 'thresholdSource';
const FIELDS: RuleField[] = ['title', 'kind', 'params', 'level', 'gate', 'citation', 'explanation', 'thresholdSource'];

export interface RuleDifference {
  rule: string;
  presence: 'both' | 'only-a' | 'only-b';
  /** Fields that differ when the rule is in both sets. */
  changed: RuleField[];
  a: Rule | null;
  b: Rule | null;
}

/** Key-order independent equality of two JSON values (RFC 8785 canonical form). */
export function sameJson(a: unknown, b: unknown): boolean {
  return canonicalize(a) === canonicalize(b);
}

/** Rules changed, removed (only-a) or added (only-b); in the order of `a`, then `b`'s additions. */
export function diffRuleSets(a: RuleSetDocument, b: RuleSetDocument): RuleDifference[] {
  const inB = new Map(b.rules.map((r) => [r.id, r]));
  const out: RuleDifference[] = [];
  for (const ra of a.rules) {
    const rb = inB.get(ra.id);
    inB.delete(ra.id);
    if (!rb) {
      out.push({ rule: ra.id, presence: 'only-a', changed: [], a: ra, b: null });
      continue;
    }
    const changed = FIELDS.filter((f) => !sameJson(ra[f], rb[f]));
    if (changed.length) out.push({ rule: ra.id, presence: 'both', changed, a: ra, b: rb });
  }
  for (const rb of inB.values()) out.push({ rule: rb.id, presence: 'only-b', changed: [], a: null, b: rb });
  return out;
}
