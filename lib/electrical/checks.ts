// Verdicts and the shape of one check. A check compares one value against one limit; its `limit` is the
// level the value must stay at or under ('atMost') or reach ('atLeast') for an ok.

export type Verdict = 'ok' | 'caution' | 'fail';

export type Check = {
  id: CheckId;
  verdict: Verdict;
  value: number;
  limit: number;
  unit: string;
  message: string;
};

export type CheckId =
  | 'supply-vs-driver-max'
  | 'supply-vs-driver-min'
  | 'headroom'
  | 'duty'
  | 'driver-max-output'
  | 'ripple'
  | 'regulator-heat'
  | 'resistor-power'
  | 'resistor-spread'
  | 'led-current'
  | 'led-power'
  | 'supply-current'
  | 'supply-peak'
  | 'wire-drop'
  | 'low-voltage-limit'
  | 'inductor-saturation'
  | 'typical-current'
  | 'wire-current-density'
  | 'led-junction'
  | 'regulator-junction';

type Direction = 'atMost' | 'atLeast';

/** Which way each check's value must sit relative to its limit. */
export const CHECK_DIRECTION: Record<CheckId, Direction> = {
  'supply-vs-driver-max': 'atMost',
  'supply-vs-driver-min': 'atLeast',
  headroom: 'atLeast',
  duty: 'atMost',
  'driver-max-output': 'atMost',
  ripple: 'atMost',
  'regulator-heat': 'atMost',
  'resistor-power': 'atMost',
  'resistor-spread': 'atLeast',
  'led-current': 'atMost',
  'led-power': 'atMost',
  'supply-current': 'atMost',
  'supply-peak': 'atMost',
  'wire-drop': 'atMost',
  'low-voltage-limit': 'atMost',
  'inductor-saturation': 'atMost',
  'typical-current': 'atLeast',
  'wire-current-density': 'atMost',
  'led-junction': 'atMost',
  'regulator-junction': 'atMost',
};

/** Short human titles for the page. */
export const CHECK_TITLE: Record<CheckId, string> = {
  'supply-vs-driver-max': 'Supply high end vs driver input rating',
  'supply-vs-driver-min': 'Supply low end vs driver minimum input',
  headroom: 'Voltage headroom for the string',
  duty: 'Driver duty cycle',
  'driver-max-output': 'Driver output voltage range',
  ripple: 'Inductor ripple current',
  'regulator-heat': 'Heat in the linear driver',
  'resistor-power': 'Heat in the series resistor',
  'resistor-spread': 'Current spread with a resistor',
  'led-current': 'LED peak current',
  'led-power': 'Power per LED',
  'supply-current': 'Supply current',
  'supply-peak': 'Supply current during PWM pulses',
  'wire-drop': 'Voltage lost in the wire run',
  'low-voltage-limit': 'Low-voltage (SELV) limit',
  'inductor-saturation': 'Inductor saturation current',
  'typical-current': 'Current with typical LEDs',
  'wire-current-density': 'Current density in the wire',
  'led-junction': 'LED junction temperature',
  'regulator-junction': 'Linear driver junction temperature',
};

export const VERDICT_RANK: Record<Verdict, number> = { ok: 0, caution: 1, fail: 2 };

export function worst(verdicts: Iterable<Verdict>): Verdict {
  let w: Verdict = 'ok';
  for (const v of verdicts) if (VERDICT_RANK[v] > VERDICT_RANK[w]) w = v;
  return w;
}

/**
 * Margin of a value against a limit, as a fraction of the limit: positive is on the safe side.
 * Ranking uses it to put the roomiest combination first. A zero limit is measured in absolute units.
 */
export function relativeMargin(direction: Direction, value: number, limit: number): number {
  const room = direction === 'atMost' ? limit - value : value - limit;
  const scale = Math.abs(limit) > 0 ? Math.abs(limit) : 1;
  const m = room / scale;
  return Number.isNaN(m) ? -Infinity : m;
}

export function checkMargin(check: Pick<Check, 'id' | 'value' | 'limit'>): number {
  return relativeMargin(CHECK_DIRECTION[check.id], check.value, check.limit);
}

/**
 * Comparisons allow a relative tolerance of 1e-9, so a value that equals its limit on paper (3 × 3.2 V is
 * 9.600000000000001 in binary floating point) sits on the limit's passing side.
 */
export const RELATIVE_TOLERANCE = 1e-9;

/** value is above limit by more than the tolerance. */
export function isAbove(value: number, limit: number): boolean {
  return value > limit + RELATIVE_TOLERANCE * Math.abs(limit);
}

/** value is below limit by more than the tolerance. */
export function isBelow(value: number, limit: number): boolean {
  return value < limit - RELATIVE_TOLERANCE * Math.abs(limit);
}

/**
 * Verdict for a value that must stay at or under `failAbove`, with a caution band starting at
 * `cautionAbove` (a value on a threshold, within the tolerance, is still on the good side).
 */
export function verdictAtMost(value: number, failAbove: number, cautionAbove = failAbove): Verdict {
  if (Number.isNaN(value) || isAbove(value, failAbove)) return 'fail';
  if (isAbove(value, cautionAbove)) return 'caution';
  return 'ok';
}

/** Verdict for a value that must reach `okFrom`; below `failUnder` it fails. */
export function verdictAtLeast(value: number, failUnder: number, okFrom = failUnder): Verdict {
  if (Number.isNaN(value) || isBelow(value, failUnder)) return 'fail';
  if (isBelow(value, okFrom)) return 'caution';
  return 'ok';
}

export function makeCheck(
  id: CheckId,
  verdict: Verdict,
  value: number,
  limit: number,
  unit: string,
  message: string,
): Check {
  return { id, verdict, value, limit, unit, message };
}
