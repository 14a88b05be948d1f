// Order list states in our own words, for screens, mail and the audit trail. Pure.
import type { OrderState } from '@/lib/domain';

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
 * arithmetic, so no binary fraction decides a cent: floor((2·units·price + pack) / (2·pack)).
 */
export function receivedCostMinor(units: number, packPriceMinor: number, packSize: number): number {
  return Math.floor((2 * units * packPriceMinor + packSize) / (2 * packSize));
}
