import { z } from 'zod';
import { CONFIDENCE_MARKERS, VALUE_STATUSES } from './types';

/**
 * Shape of a factor-set document (the checked-in JSON under ./factor-sets/ and any
 * country-specific set an admin publishes). Validated on load; never trusted blindly.
 */

const kebab = /^[a-z0-9]+(?:-[a-z0-9]+)*$/;

export const sourceRefSchema = z.object({
  document: z.string().min(1),
  volume: z.string().min(1).nullable(),
  chapter: z.string().min(1).nullable(),
  table: z.string().min(1),
  /** Null until someone reads the value in the published document and records the page. */
  page: z.string().min(1).nullable(),
});

/**
 * Published uncertainty of a value, in the form the source gives it.
 * - percent: ± percent of the value; `two-sd` = the source says ±2 SD as % of the mean,
 *   `ci95` = read as a 95% interval half-width (common practice where the basis is not stated).
 * - range: low..high in the value's unit, read as a 95% interval.
 * - plus-minus: ± in the value's unit, basis not stated (GWPs; never sampled).
 * - none: reference levels (exactly 1) or no uncertainty given; held fixed.
 * `standIn` says where an uncertainty comes from when the set's own source gave none.
 */
export const uncertaintySchema = z.discriminatedUnion('kind', [
  z.object({ kind: z.literal('none'), reason: z.string().min(1) }),
  z.object({
    kind: z.literal('percent'),
    plusMinusPercent: z.number().positive(),
    basis: z.enum(['two-sd', 'ci95']),
    standIn: z.string().min(1).optional(),
  }),
  z.object({
    kind: z.literal('range'),
    low: z.number().min(0),
    high: z.number().positive(),
    basis: z.literal('ci95'),
    standIn: z.string().min(1).optional(),
  }),
  z.object({ kind: z.literal('plus-minus'), plusMinus: z.number().positive(), basis: z.literal('unstated') }),
]);

export const factorEntrySchema = z
  .object({
    key: z.string().min(1),
    /** Null only for combinations the table marks "not applicable". */
    value: z.number().nullable(),
    unit: z.string().min(1),
    uncertainty: uncertaintySchema,
    /** Only where it differs from the table's status. */
    status: z.enum(VALUE_STATUSES).optional(),
    marker: z.enum(CONFIDENCE_MARKERS).optional(),
    /** Only where the entry comes from a different table than its table's source. */
    source: sourceRefSchema.optional(),
    note: z.string().min(1).optional(),
  })
  .superRefine((e, ctx) => {
    if ((e.value === null) !== (e.status === 'not-applicable'))
      ctx.addIssue({
        code: 'custom',
        path: ['value'],
        message: `entry ${e.key}: value must be null exactly when status is "not-applicable"`,
      });
    if (
      e.uncertainty.kind === 'range' &&
      e.value !== null &&
      !(e.uncertainty.low <= e.value && e.value <= e.uncertainty.high)
    )
      ctx.addIssue({
        code: 'custom',
        path: ['uncertainty'],
        message: `entry ${e.key}: range does not contain the value`,
      });
  });

/** An admin's confirmation of a whole table against the published document. */
export const confirmationSchema = z.object({
  by: z.string().min(1),
  at: z.string().min(1),
  document: z.string().min(1),
  page: z.string().min(1),
});

export const factorTableSchema = z
  .object({
    key: z.string().regex(kebab),
    title: z.string().min(1),
    source: sourceRefSchema,
    status: z.enum(['confirmed', 'unconfirmed']),
    marker: z.enum(CONFIDENCE_MARKERS).optional(),
    note: z.string().min(1),
    confirmation: confirmationSchema.optional(),
    entries: z.array(factorEntrySchema).min(1),
  })
  .superRefine((t, ctx) => {
    const seen = new Set<string>();
    t.entries.forEach((e, i) => {
      if (seen.has(e.key))
        ctx.addIssue({ code: 'custom', path: ['entries', i, 'key'], message: `duplicate entry key ${e.key}` });
      seen.add(e.key);
      if (t.status === 'confirmed' && e.status === 'unconfirmed')
        ctx.addIssue({
          code: 'custom',
          path: ['entries', i, 'status'],
          message: `table ${t.key} is confirmed but entry ${e.key} is not`,
        });
    });
  });

export const factorSetDocumentSchema = z
  .object({
    id: z.string().regex(kebab),
    version: z.number().int().min(1),
    title: z.string().min(1),
    description: z.string().min(1),
    tables: z.array(factorTableSchema).min(1),
  })
  .superRefine((s, ctx) => {
    const seen = new Set<string>();
    s.tables.forEach((t, i) => {
      if (seen.has(t.key))
        ctx.addIssue({ code: 'custom', path: ['tables', i, 'key'], message: `duplicate table key ${t.key}` });
      seen.add(t.key);
    });
  });

export type SourceRefDoc = z.infer<typeof sourceRefSchema>;
export type Uncertainty = z.infer<typeof uncertaintySchema>;
export type FactorEntry = z.infer<typeof factorEntrySchema>;
export type FactorTable = z.infer<typeof factorTableSchema>;
export type FactorSetDocument = z.infer<typeof factorSetDocumentSchema>;

/** Effective status of an entry: its own, else its table's. */
export function entryStatus(table: FactorTable, entry: FactorEntry): 'confirmed' | 'unconfirmed' | 'not-applicable' {
  return entry.status ?? table.status;
}
