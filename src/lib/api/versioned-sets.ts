/** Schema pieces shared by the contracts of the versioned document sets (factor sets, rule sets). */
import { z } from 'zod';

export const setIdParams = z.object({ id: z.string().min(1).max(60) });

/** `?version=` : a number, or `draft`; absent means the newest published version. */
export const versionQuery = z.object({
  version: z.union([z.literal('draft'), z.coerce.number().int().positive()]).optional(),
});

/** A set with its versions, each summarised by `version` (the set's own fields). */
export function setSummarySchema<T extends z.ZodRawShape>(version: z.ZodObject<T>, id: string) {
  return z
    .object({
      id: z.string(),
      title: z.string(),
      description: z.string(),
      origin: z.enum(['shipped', 'custom']),
      basedOn: z.object({ id: z.string(), version: z.number().int() }).nullable(),
      isDefault: z.boolean(),
      versions: z.array(version),
    })
    .meta({ id });
}

/** The body of a copy: which published version, and the new set's id, title, description and reason. */
export function copyBody(id: z.ZodString, noun: string, descriptionMax: number) {
  return z.object({
    from: z.object({ id: z.string().min(1), version: z.number().int().positive().optional() }),
    id: id.refine((v) => v !== 'diff', 'This id is reserved.'),
    title: z.string().trim().min(3).max(120),
    description: z.string().trim().min(3).max(descriptionMax),
    reason: z.string().trim().min(10, `Say why this ${noun} is needed (at least 10 characters).`).max(2000),
  });
}

/** What differs between versions a and b, one item per `item` (table entry, rule). */
export function diffResponse<T extends z.ZodRawShape>(item: T) {
  return z.object({
    a: z.string(),
    b: z.string(),
    items: z.array(
      z.object({
        ...item,
        presence: z.enum(['both', 'only-a', 'only-b']),
        changed: z.array(z.string()),
        a: z.unknown(),
        b: z.unknown(),
      }),
    ),
  });
}

export const publishNote = z.string().trim().min(5, 'Describe what this version changes.').max(2000);
