// What every check of one kit shares: the parsed spec and the quantities derived from it once.
import { awgAreaMm2, loopOhms } from './awg';
import { type Check, type CheckId, type Verdict, makeCheck } from './checks';
import { type StringVolts, type SupplyWindow, stringVolts, supplyWindow } from './circuit';
import { ceilTo } from './format';
import type { ResolvedKitSpec } from './schema';

export type KitContext = {
  spec: ResolvedKitSpec;
  supply: SupplyWindow;
  /** Supply tolerance as a fraction. */
  tol: number;
  sv: StringVolts;
  /** PWM duty, 1 when not dimmed. */
  pwm: number;
  /** Out-and-back resistance of the wire run, 0 without one. */
  wireOhms: number;
  /** Conductor area of the wire run, mm² (ASTM B258 diameter); undefined without one. */
  wireAreaMm2?: number;
  /** Whether to write the messages (ranking thousands of pairs skips them until the winners are known). */
  words: boolean;
};

export function kitContext(spec: ResolvedKitSpec, words: boolean): KitContext {
  return {
    spec,
    supply: supplyWindow(spec.supply),
    tol: spec.supply.tolerancePct / 100,
    sv: stringVolts(spec.string),
    pwm: spec.pwmDuty ?? 1,
    wireOhms: spec.wiring ? loopOhms(spec.wiring.lengthMeters, spec.wiring.awg) : 0,
    ...(spec.wiring ? { wireAreaMm2: awgAreaMm2(spec.wiring.awg) } : {}),
    words,
  };
}

/** A check whose message is only written when the context asks for words. */
export function check(
  ctx: KitContext,
  id: CheckId,
  verdict: Verdict,
  value: number,
  limit: number,
  unit: string,
  message: () => string,
): Check {
  return makeCheck(id, verdict, value, limit, unit, ctx.words ? message() : '');
}

/** Nominal supply whose low end, after `drop` in the wire, still reaches `atDriver`. */
export function supplyForLowEnd(ctx: KitContext, atDriver: number, drop: number): number {
  return ceilTo((atDriver + drop) / (1 - ctx.tol), 0.1);
}
