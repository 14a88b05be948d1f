import { z } from 'zod';

// Inputs of the kit services (templates and boxes), shared by the route handlers and the forms.
const id = (what: string) => z.uuid({ error: `${what} must be an id` });

export const templateLineSchema = z
  .object({
    partId: id('partId'),
    qty: z
      .number({ error: 'qty must be a number' })
      .int({ error: 'qty must be a whole number' })
      .min(1, { error: 'qty must be at least 1' })
      .max(500),
    chainRole: z
      .enum(['supply', 'driver', 'led', 'wire'], { error: 'chainRole must be supply, driver, led or wire' })
      .nullable()
      .default(null),
  })
  .strict();

const CHAIN_ROLES = ['supply', 'driver', 'led', 'wire'] as const;
const onlyOne = (role: string) => `only one line can be the chain's ${role}`;
/** Published in the API document: JSON Schema cannot say "at most one line per role". */
const CHAIN_ROLE_RULE = `One line per chain role at most: ${CHAIN_ROLES.map(onlyOne).join('; ')}.`;

export const templateSchema = z
  .object({
    name: z.string({ error: 'name must be text' }).trim().min(2, { error: 'give the kit a name' }).max(120),
    description: z.string().trim().max(2000).default(''),
    teachingNotes: z.string().trim().max(10000).default(''),
    cautions: z.string().trim().max(4000).default(''),
    /** A deposit taken before a box of this kit is lent, in the space's currency (ISO 4217 minor units); null: none. */
    depositMinor: z
      .number({ error: 'depositMinor must be a whole number of minor units, or null' })
      .int({ error: 'depositMinor must be a whole number of minor units' })
      .min(1, { error: 'depositMinor must be at least 1 (or null for no deposit)' })
      .max(99_999_999, { error: 'depositMinor is at most 99999999' })
      .nullable()
      .default(null),
    lines: z.array(templateLineSchema).min(1, { error: 'a kit needs at least one line' }).max(60),
  })
  .strict()
  .describe(CHAIN_ROLE_RULE)
  .superRefine((t, ctx) => {
    for (const role of CHAIN_ROLES) {
      const n = t.lines.filter((l) => l.chainRole === role).length;
      if (n > 1)
        ctx.addIssue({
          code: 'custom',
          path: ['lines'],
          message: onlyOne(role),
        });
    }
  });
export type TemplateInput = z.infer<typeof templateSchema>;

// Which units and bins a build or refill takes from; whatever is left out is chosen automatically.
const picks = {
  /** Chosen units for unit-tracked lines; lines left out are filled with free units by label order. */
  unitIds: z.array(id('unitIds entry')).max(100).default([]),
  /** Bin to take each counted part from; by default the bin holding the most. */
  fromLocations: z
    .array(z.object({ partId: id('partId'), locationId: id('locationId') }).strict())
    .max(60)
    .default([]),
};

export const refillSchema = z.object(picks).strict();

export const buildBoxSchema = z
  .object({
    templateId: id('templateId'),
    name: z.string().trim().min(2, { error: 'give the box a name' }).max(120).optional(),
    locationId: id('locationId').optional(),
    ...picks,
  })
  .strict();
export type BuildBoxInput = z.infer<typeof buildBoxSchema>;

// Box upkeep: where a part taken out of a box goes. 'repair' and 'retired' apply to labelled units; for
// counted parts they write the quantity off as damaged or lost.
const destination = z
  .enum(['shelf', 'repair', 'retired'], { error: 'to must be shelf, repair or retired' })
  .default('shelf');
const reason = z.string({ error: 'reason must be text' }).trim().max(500).default('');

/** Takes one labelled unit (optionally swapping in another of the same part) or a quantity of a counted part out of a box. */
export const takeOutSchema = z
  .object({
    unitId: id('unitId').optional(),
    replacementUnitId: id('replacementUnitId').optional(),
    partId: id('partId').optional(),
    qty: z
      .number({ error: 'qty must be a number' })
      .int({ error: 'qty must be a whole number' })
      .min(1, { error: 'qty must be at least 1' })
      .max(500)
      .default(1),
    to: destination,
    locationId: id('locationId').optional(),
    reason,
  })
  .strict()
  .superRefine((b, ctx) => {
    if ((b.unitId ? 1 : 0) + (b.partId ? 1 : 0) !== 1)
      ctx.addIssue({ code: 'custom', path: ['unitId'], message: 'give either unitId (a labelled unit) or partId (a counted part)' });
    if (b.replacementUnitId && !b.unitId)
      ctx.addIssue({ code: 'custom', path: ['replacementUnitId'], message: 'a swap replaces a labelled unit: give unitId too' });
  })
  .describe('Give either unitId (a labelled unit) or partId (a counted part); a swap replaces a labelled unit: give unitId too.');
export type TakeOutInput = z.infer<typeof takeOutSchema>;

/** Empties a box back onto the shelf and retires the box. */
export const takeApartSchema = z
  .object({ locationId: id('locationId').optional(), reason })
  .strict();
export type TakeApartInput = z.infer<typeof takeApartSchema>;
