import { z } from 'zod';
import { CATEGORIES as PART_CATEGORIES } from '@/lib/inventory/words';

// Inputs of the induction services: defining an induction in the space's own words, what needs it,
// and a steward's sign-off.
/** A 'YYYY-MM-DD' that names a real calendar day (not 2026-02-30). */
export const isRealDay = (d: string) => {
  const t = Date.parse(`${d}T00:00:00Z`);
  return !Number.isNaN(t) && new Date(t).toISOString().startsWith(d);
};

const id = (what: string) => z.uuid({ error: `${what} must be an id` });

const fields = {
  name: z
    .string({ error: 'name: text' })
    .trim()
    .min(1, 'name: give the induction a name')
    .max(80, 'name: at most 80 characters'),
  description: z.string({ error: 'description: text' }).trim().max(2000, 'description: at most 2000 characters'),
  /** Kit templates whose boxes need this induction. */
  templateIds: z.array(id('templateIds entry')).max(200).transform((a) => [...new Set(a)]),
  /** Part categories whose parts need it, loose or in a box. */
  categories: z
    .array(z.enum(PART_CATEGORIES, { error: `categories: each one of ${PART_CATEGORIES.join(', ')}` }))
    .max(PART_CATEGORIES.length)
    .transform((a) => [...new Set(a)]),
};

export const inductionSchema = z
  .object({
    name: fields.name,
    description: fields.description.default(''),
    templateIds: fields.templateIds.default([]),
    categories: fields.categories.default([]),
  })
  .strict();
export type InductionInput = z.output<typeof inductionSchema>;

export const inductionPatchSchema = z
  .object({
    name: fields.name.optional(),
    description: fields.description.optional(),
    templateIds: fields.templateIds.optional(),
    categories: fields.categories.optional(),
    archived: z.boolean({ error: 'archived: true or false' }).optional(),
  })
  .strict()
  .refine((v) => Object.values(v).some((x) => x !== undefined), { error: 'send at least one field', path: ['(body)'] })
  .describe('Send at least one field.');
export type InductionPatch = z.output<typeof inductionPatchSchema>;

export const signoffSchema = z
  .object({
    userId: id('userId'),
    /** Last day the sign-off holds (local to the space); none: it does not expire. */
    expiresOn: z
      .string({ error: 'expiresOn: a date as YYYY-MM-DD' })
      .regex(/^\d{4}-\d{2}-\d{2}$/, 'expiresOn: a date as YYYY-MM-DD')
      .refine(isRealDay, 'expiresOn: no such date')
      .meta({ format: 'date' })
      .nullish(),
    note: z.string({ error: 'note: text' }).trim().max(1000, 'note: at most 1000 characters').default(''),
  })
  .strict();
export type SignoffInput = z.output<typeof signoffSchema>;

export const signoffFilterSchema = z.object({ userId: id('userId').optional() });
