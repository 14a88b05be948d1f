import { z } from 'zod';

// One place for the inputs of the counter and the books: the route handlers, the forms and the
// services all read these.

export const MAX_BASKET_LINES = 40;

// Metres and grams may be fractions (three decimals at most, migration 0014); a part sold as whole
// items refuses one in the service (lib/sales/basket.ts), naming the same field.
const saleQty = (max: number) =>
  z
    .number({ error: 'A number, please.' })
    .multipleOf(0.001, 'At most 3 decimals.')
    .positive('More than 0.')
    .max(max, `At most ${max} at once.`);

export const saleLineInput = z.object({
  partId: z.uuid('Choose an item from the list.'),
  qty: saleQty(999),
});

export const startSaleInput = z.object({
  lines: z
    .array(saleLineInput)
    .min(1, 'The basket is empty.')
    .max(MAX_BASKET_LINES, `At most ${MAX_BASKET_LINES} lines.`),
  /** A steward selling on a member's behalf names the member; a member buys for themself. */
  buyerId: z.uuid('Choose a member from the list.').optional(),
});
export type StartSaleInput = z.infer<typeof startSaleInput>;

/** A member's own honour-box purchase: the buyer is always the caller, so no buyer is named. */
export const honourBoxSaleInput = startSaleInput.omit({ buyerId: true }).strict();

export const refundInput = z.object({
  /** Lines and quantities to refund; leave out for a full refund of whatever is left. */
  lines: z
    .array(
      z.object({
        saleLineId: z.uuid('Unknown line.'),
        qty: saleQty(10_000),
      }),
    )
    .min(1, 'Choose at least one line.')
    .max(MAX_BASKET_LINES)
    .optional(),
  restock: z.boolean().default(false),
});
export type RefundInput = z.input<typeof refundInput>;

export const monthInput = z
  .string()
  .regex(/^\d{4}-(0[1-9]|1[0-2])$/, 'Not a month: write it as YYYY-MM, with the month from 01 to 12.');
export const monthQuery = z.object({ month: monthInput.optional() });
export const closeMonthInput = z.object({
  month: monthInput,
  /** The number of unresolved rows the treasurer agrees to close with (must be the number there are). */
  confirmUnresolved: z.number().int().min(0).max(100_000).optional(),
});
export const resolutionInput = z.object({
  month: monthInput,
  rowKey: z.string().trim().min(1).max(200),
  note: z
    .string()
    .trim()
    .min(1, 'Write what you found or did about this row.')
    .max(2000, 'Keep the note under 2,000 characters.'),
});
