import { z } from 'zod';
import { kitSpecSchema } from '@/lib/electrical';

// Inputs of the loan services, one place for the route handlers, the forms and the API document.
const id = (what: string) => z.uuid({ error: `${what} must be an id` });

export const countedPickSchema = z.object({
  partId: id('partId'),
  locationId: id('locationId'),
  qty: z
    .number({ error: 'qty must be a number' })
    .int({ error: 'qty must be a whole number' })
    .min(1, { error: 'qty must be at least 1' })
    .max(1000),
});

const boxSelection = z.object({ kitBoxId: id('kitBoxId') }).strict();
const looseSelection = z
  .object({
    unitIds: z.array(id('unitIds entry')).max(50).default([]),
    counted: z.array(countedPickSchema).max(50).default([]),
  })
  .strict()
  .refine((s) => s.unitIds.length + s.counted.length > 0, {
    error: 'choose at least one unit or counted part',
    path: ['unitIds'],
  })
  .refine((s) => new Set(s.unitIds).size === s.unitIds.length, {
    error: 'a unit is listed twice',
    path: ['unitIds'],
  });

export const selectionSchema = z.union([boxSelection, looseSelection], {
  error: 'give kitBoxId, or unitIds and counted',
});
export type Selection = z.infer<typeof selectionSchema>;

/**
 * Parts the borrower brings themselves ("I have my own LEDs: these"), described with the same fields
 * as the compatibility check, so they are checked with what they borrow.
 */
export const ownPartsSchema = z
  .object({
    supply: kitSpecSchema.shape.supply.optional(),
    driver: kitSpecSchema.shape.driver.optional(),
    string: kitSpecSchema.shape.string.optional(),
    /** The sinks the borrower's LEDs sit on, when they bring their own. */
    heatSink: kitSpecSchema.shape.heatSink,
  })
  .strict()
  .refine((o) => o.supply || o.driver || o.string || o.heatSink, {
    error: 'describe at least one part (supply, driver, string or heatSink)',
    path: ['supply'],
  })
  .describe('Describe at least one part (supply, driver, string or heatSink).');
export type OwnParts = z.output<typeof ownPartsSchema>;

/** The selection's rules that JSON Schema cannot state, published in the API document in words. */
const SELECTION_RULES =
  'Give kitBoxId, or loose parts in unitIds and/or counted — borrow a kit box or loose parts, not both at once; ' +
  'choose at least one unit or counted part; refused when a unit is listed twice; ownParts go with loose parts only ' +
  '(a kit box is checked on its own contents; describe your own parts with loose parts).';

/** What the preview route takes: a selection, and for a steward lending at the bench, the borrower. */
export const previewSchema = z
  .object({
    kitBoxId: id('kitBoxId').optional(),
    unitIds: z.array(id('unitIds entry')).max(50).optional(),
    counted: z.array(countedPickSchema).max(50).optional(),
    ownParts: ownPartsSchema.optional(),
    borrowerId: id('borrowerId').optional(),
  })
  .strict()
  .describe(SELECTION_RULES)
  .transform((b, ctx) => ({
    selection: toSelection(b, ctx),
    ownParts: b.ownParts,
    borrowerId: b.borrowerId,
  }));

export const OVERRIDE_GATES = ['check', 'inductions'] as const;
export type OverrideGate = (typeof OVERRIDE_GATES)[number];
const overrideSchema = z
  .object({
    gate: z.enum(OVERRIDE_GATES, { error: 'override.gate must be check or inductions' }).default('check'),
    reason: z
      .string({ error: 'override.reason must be text' })
      .trim()
      .min(1, { error: 'write why the check is overridden' })
      .max(1000),
  })
  .strict();

/** What the API document says `override` takes (the body reads it with overridesOf, which keeps precise paths). */
const { $schema: _schema, ...overrideJsonSchema } = z.toJSONSchema(
  z.union([overrideSchema, z.array(overrideSchema).min(1).max(OVERRIDE_GATES.length)]),
  { io: 'input' },
);

/** The overrides a borrow carries, by gate; errors keep the field's path (override.reason, override.1.gate). */
function overridesOf(o: unknown, ctx: z.RefinementCtx): Partial<Record<OverrideGate, { reason: string }>> {
  if (o === undefined) return {};
  const list: [unknown, (string | number)[]][] = Array.isArray(o)
    ? o.map((x, i) => [x, ['override', i]])
    : [[o, ['override']]];
  if (Array.isArray(o) && (o.length < 1 || o.length > OVERRIDE_GATES.length))
    ctx.addIssue({ code: 'custom', path: ['override'], message: `override: one or ${OVERRIDE_GATES.length} overrides` });
  const out: Partial<Record<OverrideGate, { reason: string }>> = {};
  for (const [x, path] of list) {
    const parsed = overrideSchema.safeParse(x);
    if (!parsed.success) {
      for (const issue of parsed.error.issues)
        ctx.addIssue({ code: 'custom', path: [...path, ...(issue.path as (string | number)[])], message: issue.message });
      continue;
    }
    if (out[parsed.data.gate])
      ctx.addIssue({ code: 'custom', path: [...path, 'gate'], message: `${parsed.data.gate} is overridden twice` });
    out[parsed.data.gate] = { reason: parsed.data.reason };
  }
  return out;
}

export const borrowSchema = z
  .object({
    kitBoxId: id('kitBoxId').optional(),
    unitIds: z.array(id('unitIds entry')).max(50).optional(),
    counted: z.array(countedPickSchema).max(50).optional(),
    acknowledgeCaution: z.boolean({ error: 'acknowledgeCaution must be true or false' }).optional(),
    /**
     * A steward lending although a gate refused: which gate ('check', the compatibility check — the
     * default; or 'inductions', a missing sign-off) and why. One override, or a list of them.
     */
    override: z
      .unknown()
      .optional()
      .meta({
        ...overrideJsonSchema,
        description: `{ gate?: "check" | "inductions", reason } or a list of them; refused when a gate is overridden twice`,
      }),
    ownParts: ownPartsSchema.optional(),
    borrowerId: id('borrowerId').optional(),
  })
  .strict()
  .describe(SELECTION_RULES)
  .transform((b, ctx) => ({
    selection: toSelection(b, ctx),
    acknowledgeCaution: b.acknowledgeCaution ?? false,
    overrides: overridesOf(b.override, ctx),
    ownParts: b.ownParts,
    borrowerId: b.borrowerId,
  }));
export type BorrowInput = z.output<typeof borrowSchema>;

function toSelection(
  b: { kitBoxId?: string; unitIds?: string[]; counted?: z.infer<typeof countedPickSchema>[]; ownParts?: unknown },
  ctx: z.RefinementCtx,
): Selection {
  const loose = (b.unitIds?.length ?? 0) + (b.counted?.length ?? 0) > 0;
  if (b.kitBoxId && b.ownParts) {
    ctx.addIssue({
      code: 'custom',
      path: ['ownParts'],
      message: 'a kit box is checked on its own contents; describe your own parts with loose parts',
    });
    return z.NEVER;
  }
  if (b.kitBoxId && loose) {
    ctx.addIssue({
      code: 'custom',
      path: ['kitBoxId'],
      message: 'borrow a kit box or loose parts, not both at once',
    });
    return z.NEVER;
  }
  if (b.kitBoxId) return { kitBoxId: b.kitBoxId };
  const parsed = looseSelection.safeParse({ unitIds: b.unitIds ?? [], counted: b.counted ?? [] });
  if (!parsed.success) {
    for (const issue of parsed.error.issues)
      ctx.addIssue({ code: 'custom', path: issue.path, message: issue.message });
    return z.NEVER;
  }
  return parsed.data;
}

/** The return's rules that JSON Schema cannot state, published in the API document in words. */
const RETURN_RULES =
  'List every line of the loan or none; returnedQty at most the line qty; condition ok only when all came back, ' +
  'missing or damaged only when some did not. chargeMinor (in the space currency, ISO 4217 minor units) only by a steward, ' +
  'only on a line missing or damaged; it is taken from the loan deposit first, and the rest is owed.';

export const returnSchema = z
  .object({
    lines: z
      .array(
        z
          .object({
            lineId: id('lineId'),
            returnedQty: z
              .number({ error: 'returnedQty must be a number' })
              .int({ error: 'returnedQty must be a whole number' })
              .min(0, { error: 'returnedQty cannot be negative' })
              .max(10_000, { error: 'returnedQty is at most 10000' }),
            condition: z.enum(['ok', 'missing', 'damaged'], {
              error: 'condition must be ok, missing or damaged',
            }),
            /** A steward charging the borrower for what is missing or damaged on this line (minor units). */
            chargeMinor: z
              .number({ error: 'chargeMinor must be a number' })
              .int({ error: 'chargeMinor must be a whole number of minor units' })
              .min(1, { error: 'chargeMinor must be at least 1' })
              .max(99_999_999, { error: 'chargeMinor is at most 99999999' })
              .optional(),
            chargeNote: z.string().trim().max(2000).optional(),
          })
          .strict(),
      )
      .max(200)
      .optional(),
    note: z.string().trim().max(1000).optional(),
  })
  .strict()
  .describe(RETURN_RULES);
export type ReturnInput = z.infer<typeof returnSchema>;

export const holdSchema = z
  .object({ kitBoxId: id('kitBoxId').optional(), unitId: id('unitId').optional() })
  .strict()
  .refine((h) => (h.kitBoxId ? 1 : 0) + (h.unitId ? 1 : 0) === 1, {
    error: 'give either kitBoxId or unitId',
    path: ['kitBoxId'],
  })
  .describe('Give either kitBoxId or unitId, not both.');
export type HoldInput = z.infer<typeof holdSchema>;

export const loanFilterSchema = z.object({
  status: z
    .enum(['out', 'overdue', 'returned', 'all'], { error: 'status must be out, overdue, returned or all' })
    .default('out'),
  mine: z.enum(['0', '1']).optional(),
});

export const reminderSchema = z
  .object({
    loanIds: z
      .array(id('loanIds entry'), { error: 'loanIds must be a list of ids' })
      .min(1, { error: 'choose at least one loan' })
      .max(200),
  })
  .strict();
