// Processing fees of the demo. The rates are INVENTED for the demo (no source) — they are not any
// processor's price list. Fee = round(amount × rate) + fixed part, in the currency's minor units.
type FeeRule = { basisPoints: number; fixedMinor: number };

const RULES: Record<string, FeeRule> = {
  usd: { basisPoints: 290, fixedMinor: 30 },
  eur: { basisPoints: 250, fixedMinor: 25 },
  gbp: { basisPoints: 250, fixedMinor: 20 },
  jpy: { basisPoints: 360, fixedMinor: 0 }, // no minor unit in ISO 4217 for JPY, so no fixed part
};
const DEFAULT_RULE: FeeRule = { basisPoints: 290, fixedMinor: 30 };

export function feeRule(currency: string): FeeRule {
  return RULES[currency.toLowerCase()] ?? DEFAULT_RULE;
}

/** Fee for a charge of `amount` minor units; half a minor unit rounds up. */
export function processingFee(amount: number, currency: string): number {
  const rule = feeRule(currency);
  return Math.round((amount * rule.basisPoints) / 10_000) + rule.fixedMinor;
}
