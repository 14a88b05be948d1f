import { z } from 'zod';
import type { PartCategory } from '@/lib/domain';
import { CATEGORIES } from '@/lib/inventory/words';

// The space's money rules (issue 13): its tax, the smallest card payment it takes, and the account code
// each part category is booked under in the month's export. Kept in `spaces.settings.money`, read with
// defaults per field so a space that never saved them sells as before (no tax, any card amount).

export const TAX_MODES = ['exempt', 'inclusive', 'exclusive'] as const;
export const TAX_MODE_WORDS: Record<(typeof TAX_MODES)[number], string> = {
  exempt: 'No tax: the space does not charge tax',
  inclusive: 'Shelf prices include the tax',
  exclusive: 'Tax is added to shelf prices at the total',
};

const accountCode = z
  .string({ error: 'an account code' })
  .trim()
  .max(20, 'at most 20 characters')
  .regex(/^[A-Za-z0-9.\-/]*$/, 'letters, digits, dots, dashes and slashes only');

export const accountCodesSchema = z
  .object(Object.fromEntries(CATEGORIES.map((c) => [c, accountCode.optional()])) as Record<PartCategory, z.ZodOptional<typeof accountCode>>)
  .strict();

export const moneyRulesSchema = z
  .object({
    taxMode: z.enum(TAX_MODES, { error: `taxMode: one of ${TAX_MODES.join(', ')}` }),
    /** Hundredths of a percent (basis points): 825 is 8.25 %. */
    taxRateBp: z
      .number({ error: 'taxRateBp: a whole number of hundredths of a percent' })
      .int('taxRateBp: a whole number of hundredths of a percent (825 is 8.25 %)')
      .min(0, 'taxRateBp: at least 0')
      .max(10_000, 'taxRateBp: at most 10000 (100 %)'),
    /** What receipts call the tax: "Sales tax", "VAT", "GST". */
    taxName: z.string({ error: 'taxName: a name' }).trim().min(1, 'taxName: give the tax a name').max(40, 'taxName: at most 40 characters'),
    /** Smallest card payment, in minor units; below it the counter offers cash only. 0: any amount. */
    minCardMinor: z
      .number({ error: 'minCardMinor: a whole amount in minor units' })
      .int('minCardMinor: a whole amount in minor units (cents)')
      .min(0, 'minCardMinor: at least 0')
      .max(100_000_00, 'minCardMinor: at most 10000000'),
    /** Account code per part category, for the month's export; a category without one exports blank. */
    accountCodes: accountCodesSchema,
  })
  .strict();
export type MoneyRules = z.output<typeof moneyRulesSchema>;

export const DEFAULT_MONEY_RULES: MoneyRules = {
  taxMode: 'exempt',
  taxRateBp: 0,
  taxName: 'Tax',
  minCardMinor: 0,
  accountCodes: {},
};

export const moneyRulesPatchSchema = moneyRulesSchema
  .partial()
  .strict()
  .refine((v) => Object.values(v).some((x) => x !== undefined), { error: 'send at least one rule', path: ['(body)'] })
  .describe('Send at least one rule.');
export type MoneyRulesPatch = z.output<typeof moneyRulesPatchSchema>;

/** Stored rules, each field falling back to its default when missing or unreadable. */
export function readMoneyRules(stored: unknown): MoneyRules {
  const src = typeof stored === 'object' && stored !== null ? (stored as Record<string, unknown>) : {};
  const out: Record<string, unknown> = {};
  for (const key of Object.keys(DEFAULT_MONEY_RULES) as (keyof MoneyRules)[]) {
    const parsed = moneyRulesSchema.shape[key].safeParse(src[key]);
    out[key] = parsed.success ? parsed.data : DEFAULT_MONEY_RULES[key];
  }
  return out as MoneyRules;
}
