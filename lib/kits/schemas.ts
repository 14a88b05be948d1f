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
