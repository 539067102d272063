/**
 * A rule-set document (pure): versioned data an admin edits. Each rule names a kind the code
 * can evaluate (rule-kinds.ts), its threshold values, the level it gives, whether it is a hard
 * gate, its citation and a plain-words explanation. Validated on import, on every edit and on
 * publishing.
 */
import { z } from 'zod';
import { RULE_KIND_PARAMS, RULE_KINDS, type RuleKind } from './rule-kinds';

export const ruleSetIdSchema = z
  .string()
  .regex(/^[a-z0-9]+(?:-[a-z0-9]+)*$/, 'Use lower-case letters, digits and hyphens, e.g. "tarrow-2027".')
  .min(3)
  .max(60);
const ruleId = z
  .string()
  .regex(/^[a-z0-9]+(?:-[a-z0-9]+)*$/, 'Use lower-case letters, digits and hyphens.')
  .min(2)
  .max(60);

export const citationSchema = z.strictObject({
  /** The law, guidance or policy, e.g. "Regulation (EU) 2021/2115". */
  source: z.string().trim().min(3).max(300),
  /** Article, annex, regulation or paragraph, e.g. "Annex III, GAEC 9". */
  article: z.string().trim().min(1).max(200),
});

const ruleBase = {
  id: ruleId,
  title: z.string().trim().min(3).max(120),
  /** 2-4: a rule giving level 1 would change nothing. */
  level: z.union([z.literal(2), z.literal(3), z.literal(4)]),
  /** A hard gate sets the top level (4) whatever else holds. */
  gate: z.boolean(),
  citation: citationSchema,
  /** Plain words: what the rule protects and why it sets this level. */
  explanation: z.string().trim().min(10).max(2000),
  /** Where the threshold value comes from: the law itself, guidance, or the authority's own choice. */
  thresholdSource: z.string().trim().min(3).max(300),
};

const ruleVariants = RULE_KINDS.map((k) =>
  z.strictObject({ ...ruleBase, kind: z.literal(k), params: RULE_KIND_PARAMS[k] }),
);

type RuleOf<K extends RuleKind> = {
  id: string;
  title: string;
  level: 2 | 3 | 4;
  gate: boolean;
  citation: z.output<typeof citationSchema>;
  explanation: string;
  thresholdSource: string;
  kind: K;
  params: z.output<(typeof RULE_KIND_PARAMS)[K]>;
};
export type Rule = { [K in RuleKind]: RuleOf<K> }[RuleKind];

export const ruleSchema = (
  z.discriminatedUnion('kind', ruleVariants as unknown as [z.ZodObject, ...z.ZodObject[]]) as unknown as z.ZodType<Rule>
).superRefine((r, ctx) => {
  if (r.gate && r.level !== 4)
    ctx.addIssue({ code: 'custom', path: ['level'], message: 'A hard gate sets the top level: give it level 4.' });
});

export const ruleSetDocumentSchema = z
  .strictObject({
    id: ruleSetIdSchema,
    version: z.number().int().positive(),
    title: z.string().trim().min(3).max(120),
    description: z.string().trim().min(3).max(2000),
    /** Whose rules these are, e.g. the authority's name. */
    authority: z.string().trim().min(3).max(200),
    rules: z.array(ruleSchema).min(1, 'A rule set needs at least one rule.'),
  })
  .superRefine((doc, ctx) => {
    const seen = new Set<string>();
    doc.rules.forEach((r, i) => {
      if (seen.has(r.id))
        ctx.addIssue({ code: 'custom', path: ['rules', i, 'id'], message: `Rule id "${r.id}" is used twice.` });
      seen.add(r.id);
    });
  });

export type RuleSetDocument = z.output<typeof ruleSetDocumentSchema>;

/** "Source, article" as a grade reason shows it. */
export function citationText(r: Pick<Rule, 'citation'>): string {
  return `${r.citation.source}, ${r.citation.article}`;
}
