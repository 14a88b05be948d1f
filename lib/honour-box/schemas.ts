import { z } from 'zod';

// The honour box: a steward counts the cash in it against what the books say should be there, and
// takes it to the bank. Amounts are integer minor units of the space's currency (ISO 4217).

const minor = (field: string) =>
  z
    .number({ error: `${field}: a whole amount in minor units (cents)` })
    .int(`${field}: a whole amount in minor units (cents)`)
    .min(0, `${field}: at least 0`)
    .max(100_000_000, `${field}: at most 100000000`);

export const boxCountInput = z
  .object({
    /** What the steward counted in the box. */
    countedMinor: minor('countedMinor'),
    /** Why the count differs from what was expected; required when it does. */
    note: z.string().trim().max(2000, 'note: at most 2,000 characters').default(''),
  })
  .strict()
  .describe('note is required when countedMinor differs from what the books expect in the box.');
export type BoxCountInput = z.input<typeof boxCountInput>;

export const boxBankingInput = z
  .object({
    countId: z.uuid('countId: choose a count of the box'),
    amountMinor: minor('amountMinor').min(1, 'amountMinor: at least 1'),
    /** The bank's deposit reference or slip number, if there is one. */
    reference: z.string().trim().max(200, 'reference: at most 200 characters').default(''),
  })
  .strict()
  .describe('amountMinor cannot exceed what the count found in the box; only the latest count can be banked, once.');
export type BoxBankingInput = z.input<typeof boxBankingInput>;
