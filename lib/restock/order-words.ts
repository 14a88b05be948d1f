// Order list states in our own words, for screens, mail and the audit trail. Pure.
import type { OrderState } from '@/lib/domain';
import { divRoundHalfUp } from '@/lib/money';

export type { OrderState };

export const ORDER_STATE_WORDS: Record<OrderState, string> = {
  draft: 'Being put together',
  sent: 'With the supplier',
  part_in: 'Part arrived',
  all_in: 'All arrived',
  called_off: 'Called off',
};

/**
 * What a receipt line cost: units × pack price ÷ pack size, in minor units, rounded half up to the
 * nearest minor unit (half up: 0.5 goes away from zero; amounts here are never negative). Integer
 * arithmetic, so no binary fraction decides a cent: units and pack size (metres and grams may carry
 * three decimals, migration 0014) are taken in thousandths, then floor((2·units·price + pack) / (2·pack)).
 */
export function receivedCostMinor(units: number, packPriceMinor: number, packSize: number): number {
  const u = BigInt(Math.round(units * 1000));
  const pack = BigInt(Math.round(packSize * 1000));
  return Number(divRoundHalfUp(u * BigInt(packPriceMinor), pack));
}
