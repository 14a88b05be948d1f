// The compatibility check: supply → (wire) → driver → LED string. Worst case by default: the supply's
// tolerance band and the LEDs' forward-voltage spread, not only the typical values.
import { buck } from './buck';
import { worst } from './checks';
import { kitContext } from './kitContext';
import { linear } from './linear';
import type { KitFigures, KitReport } from './report';
import { resistor } from './resistor';
import { type KitSpec, type ResolvedKitSpec, kitSpecSchema } from './schema';

export type { KitFigures, KitReport } from './report';

/** Parses the spec (defaults applied; bad input throws a ZodError naming the field) and checks it. */
export function checkKit(spec: KitSpec): KitReport {
  return evaluateKit(kitSpecSchema.parse(spec));
}

/**
 * The check on an already parsed spec. `messages: false` leaves every message empty: the ranking runs
 * thousands of pairs and writes the words only for the ones it returns.
 */
export function evaluateKit(spec: ResolvedKitSpec, options: { messages?: boolean } = {}): KitReport {
  const ctx = kitContext(spec, options.messages ?? true);
  const d = spec.driver;
  const { checks, figures } = d.type === 'buck' ? buck(ctx, d) : d.type === 'linear' ? linear(ctx, d) : resistor(ctx, d);
  return {
    verdict: worst(checks.map((c) => c.verdict)),
    checks: checks.map((c) => ({ ...c, value: finite(c.value), limit: finite(c.limit) })),
    figures: Object.fromEntries(Object.entries(figures).map(([k, v]) => [k, finite(v)])) as KitFigures,
  };
}

/**
 * The bounds keep bench-sized inputs far from overflow, but the smallest accepted numbers (subnormals
 * such as 1e-310) can still divide to ±Infinity or 0/0. The verdicts are decided before this (NaN
 * fails every check); the report then carries the nearest finite number, so JSON never holds null.
 */
export function finite(x: number): number {
  if (Number.isNaN(x)) return 0;
  if (x === Infinity) return Number.MAX_VALUE;
  if (x === -Infinity) return -Number.MAX_VALUE;
  return x;
}
