import { loopOhms } from './awg';
import { MAX_AWG, MIN_AWG } from './schema';

/** How the trade writes a gauge: 0 is 1/0, −3 is 4/0. */
export function awgName(awg: number): string {
  return awg <= 0 ? `${1 - awg}/0` : String(awg);
}

/**
 * The thinnest gauge whose out-and-back run keeps the drop within `maxDropVolts`, given how the drop
 * depends on the loop resistance (it differs for constant-current, constant-power and resistor loads).
 * Null when even 4/0 is not enough.
 */
export function suggestAwg(
  lengthMeters: number,
  dropForLoopOhms: (ohms: number) => number,
  maxDropVolts: number,
): number | null {
  for (let awg = MAX_AWG; awg >= MIN_AWG; awg--) {
    if (dropForLoopOhms(loopOhms(lengthMeters, awg)) <= maxDropVolts) return awg;
  }
  return null;
}
