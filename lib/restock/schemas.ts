// Input shapes of restocking (issue 13), for route handlers, forms and tests. Pure module (zod only).
import { z } from 'zod';
import { idSchema } from '@/lib/ids';

const MAX_MINOR = 100_000_000;
const minor = (what: string) =>
  z
    .number({ error: `${what} must be a number` })
    .int(`${what} must be whole minor units`)
    .min(0, `${what} must not be negative`)
    .max(MAX_MINOR, `${what} must be at most ${MAX_MINOR} minor units`);
const whole = (what: string, min: number, max: number) =>
  z
    .number({ error: `${what} must be a number` })
    .int(`${what} must be a whole number`)
    .min(min, `${what} must be at least ${min}`)
    .max(max, `${what} must be at most ${max}`);

/** Metres and grams may be fractions (at most three decimals, migration 0014); whole items are checked by the service. */
const measured = (what: string, max: number) =>
  z
    .number({ error: `${what} must be a number` })
    .multipleOf(0.001, `${what} may have at most 3 decimals`)
    .max(max, `${what} must be at most ${max}`);

export const supplierSchema = z.object({
  name: z.string({ error: 'name is required' }).trim().min(1, 'name is required').max(120, 'name is at most 120 characters'),
  website: z
    .union([z.literal(''), z.url({ protocol: /^https?$/, error: 'website must be an http(s) address' })])
    .default('')
    .describe('Empty, or an address of the web: website must be an http(s) address.'),
  email: z.union([z.literal(''), z.email({ error: 'contact e-mail must be an e-mail address' })]).default(''),
  leadDays: whole('lead time', 0, 365).default(7),
  minOrderMinor: minor('minimum order').default(0),
  notes: z.string().max(2000, 'notes are at most 2000 characters').default(''),
});
export const supplierPatchSchema = supplierSchema
  .extend({ archived: z.boolean() })
  .partial()
  .strict();

export const offerSchema = z.object({
  supplierId: idSchema,
  partId: idSchema,
  itemRef: z.string().trim().max(80, 'their reference is at most 80 characters').default(''),
  packSize: measured('pack size', 100_000).positive('pack size must be more than 0'),
  packPriceMinor: minor('price per pack'),
  preferred: z.boolean().default(false),
});

const idempotencyKey = z
  .string({ error: 'idempotency key is required' })
  .min(8, 'idempotency key is 8 to 100 characters')
  .max(100, 'idempotency key is 8 to 100 characters')
  .regex(/^[A-Za-z0-9_-]+$/, 'idempotency key may use letters, digits, _ and -');

export const orderLineInput = z.object({
  partId: idSchema,
  packs: whole('packs', 1, 100_000),
});

export const orderCreateSchema = z.object({
  supplierId: idSchema,
  lines: z.array(orderLineInput).min(1, 'an order list needs at least one line').max(500),
  note: z.string().trim().max(1000).default(''),
});

export const orderPatchSchema = z
  .object({
    lines: z
      .array(orderLineInput)
      .min(1, 'an order list needs at least one line; call it off instead')
      .max(500)
      .describe('The whole list of lines: a part left out is dropped. Only a draft changes.'),
    note: z.string().trim().max(1000),
  })
  .partial()
  .strict();

export const sendSchema = z.object({
  approvalNote: z
    .string()
    .trim()
    .max(1000)
    .optional()
    .describe('An admin sending past the month’s budget approves it with this note (at least 3 characters).'),
});

export const approveSchema = z.object({
  note: z.string({ error: 'say why' }).trim().min(3, 'say why (at least 3 characters)').max(1000),
});

export const receiveLineInput = z.object({
  lineId: idSchema,
  units: measured('units', 1_000_000).positive('units must be more than 0'),
  /** What the pack really cost, when it differs from the order (minor units). */
  packPriceMinor: minor('price paid per pack').optional(),
  locationId: idSchema.nullable().default(null),
  /** How many units of the line the steward's screen showed as already received (guards two at once). */
  receivedBefore: measured('received before', 10_000_000).min(0, 'received before must be at least 0'),
});

export const orderReceiveSchema = z.object({
  idempotencyKey,
  lines: z
    .array(receiveLineInput)
    .max(500)
    .default([])
    .describe('What arrived, per line. May be empty only with finish: true (400 naming lines otherwise).'),
  /** Nothing more is coming: the order is done even where fewer arrived than ordered. */
  finish: z.boolean().default(false),
  note: z.string().trim().max(500).default(''),
});

export const cancelSchema = z.object({
  note: z.string({ error: 'say why' }).trim().min(3, 'say why (at least 3 characters)').max(1000),
});

export const budgetSchema = z.object({
  monthlyBudgetMinor: minor('monthly budget').nullable(),
});

export type OrderReceiveInput = z.output<typeof orderReceiveSchema>;
