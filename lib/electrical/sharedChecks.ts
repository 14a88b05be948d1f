// Checks every driver type runs: the supply against the driver's input range, headroom for the string,
// LED current and power, supply current, and the wire run.
import type { Check, Verdict } from './checks';
import { verdictAtLeast, verdictAtMost } from './checks';
import { ceilTo, floorTo, formatAmps, formatPercent, formatSi, formatVolts, formatWatts } from './format';
import { type KitContext, check, supplyForLowEnd } from './kitContext';
import { LED_POWER_CAUTION_FRACTION, SUPPLY_CURRENT_CAUTION_FRACTION, WIRE_DROP_CAUTION_FRACTION } from './thresholds';
import { awgName, suggestAwg } from './wire';

const toleranceText = (ctx: KitContext) => (ctx.tol > 0 ? ` with its ${formatPercent(ctx.tol)} tolerance` : '');

export function supplyVsDriverMax(ctx: KitContext, maxIn: number): Check {
  const high = ctx.supply.high;
  const verdict = verdictAtMost(high, maxIn);
  return check(ctx, 'supply-vs-driver-max', verdict, high, maxIn, 'V', () =>
    verdict === 'ok'
      ? `The supply's high end (${formatVolts(high)}) is within the driver's ${formatVolts(maxIn)} input rating.`
      : `The supply can reach ${formatVolts(high)}${toleranceText(ctx)}, above the driver's ${formatVolts(maxIn)} input rating. Choose a driver rated for at least ${formatVolts(ceilTo(high, 0.1))} in, or a supply of at most ${formatVolts(floorTo(maxIn / (1 + ctx.tol), 0.1))}.`,
  );
}

export function supplyVsDriverMin(ctx: KitContext, vLow: number, drop: number, minIn: number): Check {
  const verdict = verdictAtLeast(vLow, minIn);
  return check(ctx, 'supply-vs-driver-min', verdict, vLow, minIn, 'V', () =>
    verdict === 'ok'
      ? `The supply's low end at the driver (${formatVolts(vLow)}) is above the driver's ${formatVolts(minIn)} minimum input.`
      : `The supply's low end at the driver (${formatVolts(vLow)}) is below the driver's ${formatVolts(minIn)} minimum input. Use a supply of at least ${formatVolts(supplyForLowEnd(ctx, minIn, drop))}.`,
  );
}

/**
 * Enough voltage at the driver for the string plus what the driver itself needs (headroom for a buck,
 * dropout for a linear, nothing for a resistor). Typical LEDs short of it: fail; worst-case LEDs short of
 * it: caution (works on most parts, may lose regulation on high-Vf ones).
 */
export function headroom(
  ctx: KitContext,
  vLow: number,
  drop: number,
  extra: number,
  extraName: 'headroom' | 'dropout' | null,
): Check {
  const { sv } = ctx;
  const needTyp = sv.typ + extra;
  const needMax = sv.max + extra;
  const verdict = verdictAtLeast(vLow, needTyp, needMax);
  return check(ctx, 'headroom', verdict, vLow, needMax, 'V', () => {
    const parts = (string: number) => (extraName ? ` (string ${formatVolts(string)} + ${formatVolts(extra)} ${extraName})` : '');
    const fit = Math.floor((vLow - extra) / ctx.spec.string.led.vfMax);
    const fewer = fit >= 1 && fit < ctx.spec.string.count ? `, or drive at most ${fit} LEDs from this one` : '';
    const advice = `Use a supply of at least ${formatVolts(supplyForLowEnd(ctx, needMax, drop))}${fewer}.`;
    const where = drop > 0 ? ' at the driver' : '';
    if (verdict === 'ok')
      return `The supply's low end gives ${formatVolts(vLow)}${where}; worst-case LEDs need ${formatVolts(needMax)}${parts(sv.max)}.`;
    if (verdict === 'caution')
      return `Typical LEDs work, but worst-case ones need ${formatVolts(needMax)}${parts(sv.max)} and the supply's low end gives ${formatVolts(vLow)}${where}, so the current may sag. ${advice}`;
    return `The supply's low end gives ${formatVolts(vLow)}${where}, short of the ${formatVolts(needTyp)} even typical LEDs need${parts(sv.typ)}. ${advice}`;
  });
}

export function ledCurrentFromDriver(ctx: KitContext, amps: number): Check {
  const { maxAmps } = ctx.spec.string.led;
  const verdict = verdictAtMost(amps, maxAmps);
  return check(ctx, 'led-current', verdict, amps, maxAmps, 'A', () =>
    verdict === 'ok'
      ? `The driver sets ${formatAmps(amps)}, within the LED's ${formatAmps(maxAmps)} rating.`
      : `The driver sets ${formatAmps(amps)}, above the LED's ${formatAmps(maxAmps)} rating; PWM dimming does not lower this peak. Choose a driver of at most ${formatAmps(maxAmps)}.`,
  );
}

/** Power per LED at its typical forward voltage and average current; `peakAmps` is before PWM. */
export function ledPower(ctx: KitContext, peakAmps: number): Check {
  const { vfTyp, maxWatts } = ctx.spec.string.led;
  const watts = vfTyp * ctx.pwm * peakAmps;
  const verdict = verdictAtMost(watts, maxWatts, LED_POWER_CAUTION_FRACTION * maxWatts);
  return check(ctx, 'led-power', verdict, watts, maxWatts, 'W', () => {
    if (verdict === 'ok') return `Each LED takes ${formatWatts(watts)} of its ${formatWatts(maxWatts)} rating.`;
    if (verdict === 'caution')
      return `Each LED takes ${formatWatts(watts)}, over 70 % of its ${formatWatts(maxWatts)} rating: mount the LEDs on a heat sink.`;
    const dutyThatFits = maxWatts / (vfTyp * peakAmps);
    const pwmAdvice = dutyThatFits < 1 ? ` (or PWM duty of at most ${formatPercent(floorTo(dutyThatFits, 0.001))})` : '';
    return `Each LED would take ${formatWatts(watts)}, above its ${formatWatts(maxWatts)} rating. Lower the current to at most ${formatAmps(maxWatts / vfTyp)}${pwmAdvice}.`;
  });
}

export function supplyCurrent(ctx: KitContext, amps: number): Check {
  const { maxAmps } = ctx.spec.supply;
  const verdict = verdictAtMost(amps, maxAmps, SUPPLY_CURRENT_CAUTION_FRACTION * maxAmps);
  return check(ctx, 'supply-current', verdict, amps, maxAmps, 'A', () => {
    const roomy = formatAmps(ceilTo(amps / SUPPLY_CURRENT_CAUTION_FRACTION, 0.1));
    if (verdict === 'ok') return `The build draws ${formatAmps(amps)} of the supply's ${formatAmps(maxAmps)}.`;
    if (verdict === 'caution')
      return `The build draws ${formatAmps(amps)}, over 80 % of the supply's ${formatAmps(maxAmps)}, leaving little reserve. A supply rated ${roomy} or more leaves room.`;
    return `The build needs ${formatAmps(amps)}, more than the supply's ${formatAmps(maxAmps)}. Use a supply rated for at least ${roomy}.`;
  });
}

/** With PWM the average is lower, but each pulse draws the full current from the supply. */
export function supplyPeak(ctx: KitContext, ampsOn: number): Check {
  const { maxAmps } = ctx.spec.supply;
  const verdict = verdictAtMost(ampsOn, Infinity, maxAmps);
  return check(ctx, 'supply-peak', verdict, ampsOn, maxAmps, 'A', () =>
    verdict === 'ok'
      ? `During each PWM pulse the supply gives ${formatAmps(ampsOn)}, within its ${formatAmps(maxAmps)} rating.`
      : `During each PWM pulse the supply must give ${formatAmps(ampsOn)}, above its ${formatAmps(maxAmps)} rating, even though the average is lower; it may hit its current limit. Use a supply rated for at least ${formatAmps(ceilTo(ampsOn, 0.1))}.`,
  );
}

export function wireDrop(
  ctx: KitContext,
  drop: number,
  collapsed: boolean,
  dropForLoopOhms: (ohms: number) => number,
): Check {
  const wiring = ctx.spec.wiring!;
  const limit = WIRE_DROP_CAUTION_FRACTION * ctx.supply.nominal;
  const verdict: Verdict = collapsed ? 'fail' : verdictAtMost(drop, Infinity, limit);
  return check(ctx, 'wire-drop', verdict, drop, limit, 'V', () => {
    const run = `The ${formatSi(wiring.lengthMeters, 'm')} run of ${awgName(wiring.awg)} AWG`;
    const share = formatPercent(drop / ctx.supply.nominal);
    if (verdict === 'ok') return `${run} drops ${formatVolts(drop)} out and back (${share} of the supply).`;
    const better = suggestAwg(wiring.lengthMeters, dropForLoopOhms, limit);
    const advice =
      better !== null
        ? `Use ${awgName(better)} AWG or thicker, or a shorter run.`
        : 'No common wire is thick enough for this run: move the supply closer to the driver.';
    if (verdict === 'caution') return `${run} drops ${formatVolts(drop)} out and back, ${share} of the supply (over 5 %). ${advice}`;
    return `${run} has too much resistance (${formatSi(ctx.wireOhms, 'Ω')} out and back) to carry the driver's power. ${advice}`;
  });
}
