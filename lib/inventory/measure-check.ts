import { InvalidError } from '@/lib/errors';
import { measureOf, qtyProblem } from './measure';

/**
 * 400 naming `field` when `qty` does not fit the part's unit of measure: a fraction of a part counted
 * in whole items, or more than three decimals of metres or grams.
 */
export function refuseQtyNotInUnit(qty: number, saleUnit: string, field: string, what = 'quantity'): void {
  const problem = qtyProblem(qty, measureOf(saleUnit));
  if (problem)
    throw new InvalidError(`Check ${field}: the ${what} ${problem}.`, {
      [field]: [`the ${what} ${problem}`],
    });
}
