// Input shapes of the shelf, in one place for route handlers, forms and tests.
// Pure module (zod only): the client forms and the unit tests import it.
import { z } from 'zod';
import { idSchema } from '@/lib/ids';

import { MEASURES } from './measure';
import { CATEGORIES, LOCATION_KINDS, PART_SORTS, TRACKING } from './words';

export { CATEGORIES, CATEGORY_WORDS, LOCATION_KINDS, PART_SORTS, TRACKING, type PartSort } from './words';

/** An empty query-string or form value means "not given". */
const blankAsUndefined = (v: unknown) => (v === '' || v === null ? undefined : v);
const optionalEnum = <T extends readonly [string, ...string[]]>(values: T) =>
  z.preprocess(blankAsUndefined, z.enum(values).optional());
const flag = z.preprocess(
  (v) =>
    v === '1' || v === 'true' || v === true
      ? true
      : v === '0' || v === 'false' || v === false || blankAsUndefined(v) === undefined
        ? false
        : v,
  z.boolean(),
);

/** Ids in bodies: the one id schema (lib/ids.ts). */
export const uuid = idSchema;
const wholeQty = (what: string) =>
  z.number({ error: `${what} must be a number` }).int(`${what} must be a whole number`);
/**
 * A quantity of counted stock: metres and grams take up to three decimals (migration 0014). Whether the
 * part takes a fraction at all is the service's check (lib/inventory/measure.ts `qtyProblem`), which
 * names the same field: a part counted in whole items refuses 1.5.
 */
export const measuredQty = (what: string) =>
  z
    .number({ error: `${what} must be a number` })
    .multipleOf(0.001, `${what} may have at most 3 decimals`);
const measure = z.enum(MEASURES, { error: 'choose each, metre or gram' });

// ---------------------------------------------------------------- parts table

export const partListQuerySchema = z.object({
  q: z.preprocess(blankAsUndefined, z.string().trim().max(100).optional()),
  category: optionalEnum(CATEGORIES),
  tracking: optionalEnum(TRACKING),
  below: flag.default(false),
  sort: z.preprocess(blankAsUndefined, z.enum(PART_SORTS).default('name')),
  dir: z.preprocess(blankAsUndefined, z.enum(['asc', 'desc']).default('asc')),
  page: z.preprocess(blankAsUndefined, z.coerce.number().int().min(1).max(100_000).default(1)),
  pageSize: z.preprocess(blankAsUndefined, z.coerce.number().int().min(1).max(200).default(50)),
});
export type PartListQuery = z.infer<typeof partListQuerySchema>;

// ---------------------------------------------------------------- parts

export const MAX_PRICE_MINOR = 100_000_000;
const price = z
  .number({ error: 'price must be a number' })
  .int('price must be whole minor units')
  .nonnegative('price must not be negative')
  // The column is a 32-bit integer; a million in major units is far past any part at the bench.
  .max(MAX_PRICE_MINOR, `price must be at most ${MAX_PRICE_MINOR} minor units`);
const partFields = {
  sku: z
    .string({ error: 'SKU is required' })
    .trim()
    .min(1, 'SKU is required')
    .max(60, 'SKU is at most 60 characters')
    .regex(/^[A-Za-z0-9][A-Za-z0-9._/-]*$/, 'SKU may use letters, digits and . _ / - (no spaces)'),
  name: z
    .string({ error: 'name is required' })
    .trim()
    .min(1, 'name is required')
    .max(200, 'name is at most 200 characters'),
  category: z.enum(CATEGORIES, { error: 'choose a category' }),
  specs: z.record(z.string(), z.unknown()).default({}),
  sellable: z.boolean().default(false),
  lendable: z.boolean().default(true),
  priceMinor: price.nullable().default(null),
  saleUnit: measure.default('each'),
  reorderPoint: wholeQty('reorder point')
    .min(0, 'reorder point must not be negative')
    .max(1_000_000)
    .default(0),
  notes: z.string().max(2000).default(''),
};

export const partCreateSchema = z.object({
  ...partFields,
  tracking: z.enum(TRACKING, { error: 'choose counted or labelled units' }),
  /** Labelled parts only: how many units to label straight away. */
  units: wholeQty('units').min(0).max(500, 'at most 500 units at once').default(0),
  locationId: uuid.nullable().optional(),
});
export type PartCreateInput = z.input<typeof partCreateSchema>;

export const partUpdateSchema = z
  .object({
    sku: partFields.sku,
    name: partFields.name,
    category: partFields.category,
    tracking: z.enum(TRACKING),
    specs: z.record(z.string(), z.unknown()),
    sellable: z.boolean(),
    lendable: z.boolean(),
    priceMinor: price.nullable(),
    saleUnit: measure,
    reorderPoint: wholeQty('reorder point').min(0, 'reorder point must not be negative').max(1_000_000),
    notes: z.string().max(2000),
    archived: z.boolean(),
  })
  .partial();
export type PartUpdateInput = z.input<typeof partUpdateSchema>;

export const addUnitsSchema = z.object({
  count: wholeQty('count').min(1, 'add at least one unit').max(500, 'at most 500 units at once'),
  locationId: uuid.nullable().optional(),
  serialPrefix: z.string().trim().max(40).optional(),
});

// ---------------------------------------------------------------- stock

const qtyPositive = measuredQty('quantity')
  .positive('quantity must be more than 0')
  .max(1_000_000, 'quantity is too large');
const note = z.string().trim().max(500).default('');

export const receiveSchema = z.object({
  partId: uuid,
  locationId: uuid
    .nullable()
    .default(null)
    .describe('The bin: required for a counted part (400 "choose a bin"); a labelled part may have none yet.'),
  qty: qtyPositive,
  note,
});
export const moveSchema = z
  .object({ partId: uuid, fromLocationId: uuid, toLocationId: uuid, qty: qtyPositive, note })
  .refine((m) => m.fromLocationId !== m.toLocationId, {
    path: ['toLocationId'],
    message: 'choose a different bin to move to',
  });
export const ADJUST_REASONS = ['adjust', 'lost', 'damaged'] as const;
export const adjustSchema = z.object({
  partId: uuid,
  locationId: uuid,
  delta: measuredQty('change')
    .min(-1_000_000)
    .max(1_000_000)
    .refine((d) => d !== 0, 'the change must not be zero'),
  reason: z.enum(ADJUST_REASONS).default('adjust'),
  note: z.string({ error: 'say why' }).trim().min(3, 'say why (at least 3 characters)').max(500),
});
export const moveUnitSchema = z.object({ unitId: uuid, toLocationId: uuid, note });

/**
 * POST /api/stock/move: a body naming `unitId` moves that labelled unit; anything else is a counted move,
 * so a bad body's errors name the counted move's fields. Tagged with `kind` for the service call.
 */
export const stockMoveSchema = z
  .unknown()
  .transform((raw, ctx) => {
    const unit = typeof raw === 'object' && raw !== null && 'unitId' in raw;
    const parsed = unit ? moveUnitSchema.safeParse(raw) : moveSchema.safeParse(raw);
    if (!parsed.success) {
      for (const issue of parsed.error.issues) ctx.addIssue({ ...issue, code: 'custom', message: issue.message });
      return z.NEVER;
    }
    return unit
      ? { kind: 'unit' as const, move: parsed.data as z.output<typeof moveUnitSchema> }
      : { kind: 'counted' as const, move: parsed.data as z.output<typeof moveSchema> };
  });
/** The same body as documented: one of the two shapes. */
export const stockMoveDoc = z.union([moveSchema, moveUnitSchema]);

export const UNIT_TARGET_STATES = ['in_repair', 'on_shelf', 'retired'] as const;
export const unitStateSchema = z.object({
  state: z.enum(UNIT_TARGET_STATES, { error: 'choose in repair, on shelf or retired' }),
  reason: z.string({ error: 'say why' }).trim().min(3, 'say why (at least 3 characters)').max(500),
  locationId: uuid.nullable().optional(),
});

// ---------------------------------------------------------------- locations

export const locationCreateSchema = z.object({
  name: z.string({ error: 'name is required' }).trim().min(1, 'name is required').max(80),
  kind: z.enum(LOCATION_KINDS).default('bin'),
  parentId: uuid.nullable().optional(),
});
export const locationUpdateSchema = locationCreateSchema.partial();

// ---------------------------------------------------------------- counts

export const countOpenSchema = z.object({ locationId: uuid });
export const countLinesSchema = z.object({
  lines: z
    .array(
      z.object({
        partId: uuid,
        counted: measuredQty('count').min(0, 'a count cannot be negative').max(1_000_000).nullable(),
      }),
    )
    .max(2000),
});

// ---------------------------------------------------------------- labels

export const labelSelectionSchema = z.discriminatedUnion('kind', [
  z.object({ kind: z.literal('part'), partId: uuid, includePart: z.boolean().default(false) }),
  z.object({ kind: z.literal('location'), locationId: uuid, contents: z.boolean().default(true) }),
  z.object({
    kind: z.literal('codes'),
    codes: z.array(z.string().max(20)).min(1, 'give at least one code').max(5000),
  }),
  z.object({ kind: z.literal('today') }),
]);
export type LabelSelection = z.infer<typeof labelSelectionSchema>;

export const labelRequestSchema = z.object({
  selection: labelSelectionSchema,
  layoutId: z.string().max(40).optional(),
  skipSlots: z.number().int().min(0).max(100).default(0),
  outline: z.boolean().default(false),
});

// ---------------------------------------------------------------- scan

export const codesLookupSchema = z.object({ codes: z.array(z.string().max(20)).min(1).max(20) });

// ---------------------------------------------------------------- import

export const importRequestSchema = z.object({
  csv: z
    .string({ error: 'paste or upload a CSV file' })
    .min(1, 'the file is empty')
    .max(2_000_000, 'the file is larger than 2 MB'),
});
