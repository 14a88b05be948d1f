// Checks every driver type runs: the low-voltage limit, the supply against the driver's input range,
// headroom for the string, LED current, power and junction temperature, supply current, and the wire run.
import type { Check, Verdict } from './checks';
import { isAbove, verdictAtLeast, verdictAtMost } from './checks';
import { ceilTo, floorTo, formatAmps, formatCelsius, formatPair, formatPercent, formatQuantity, formatSi, formatVolts } from './format';
import { type KitContext, check, supplyForLowEnd } from './kitContext';
import { JUNCTION_CAUTION_MARGIN_C, type LedThermal, ledThermal } from './thermal';
import {
  LED_POWER_CAUTION_FRACTION,
  SELV_DC_LIMIT_VOLTS,
  SUPPLY_CURRENT_CAUTION_FRACTION,
  WIRE_DENSITY_CAUTION_A_PER_MM2,
  WIRE_DENSITY_FAIL_A_PER_MM2,
  WIRE_DROP_ADVICE_FRACTION,
} from './thresholds';
import { awgName, suggestAwg } from './wire';
import { awgAreaMm2 } from './awg';
import { MAX_AWG, MIN_AWG } from './schema';

/** A sink's thermal resistance for advice, rounded down (a smaller number is the better sink). */
export function sinkText(cPerW: number): string {
  if (cPerW >= 0.1) return `${floorTo(cPerW, 0.1).toFixed(1)} °C/W`;
  return `${Number(cPerW.toPrecision(2))} °C/W`;
}

const toleranceText = (ctx: KitContext) => (ctx.tol > 0 ? ` with its ${formatPercent(ctx.tol)} tolerance` : '');

/** Rule 1: above 60 V DC the build leaves extra-low voltage (SELV), and the bench's scope. */
export function lowVoltageLimit(ctx: KitContext): Check {
  const high = ctx.supply.high;
  const verdict = verdictAtMost(high, SELV_DC_LIMIT_VOLTS);
  return check(ctx, 'low-voltage-limit', verdict, high, SELV_DC_LIMIT_VOLTS, 'V', () => {
    const [v, l] = formatPair(high, SELV_DC_LIMIT_VOLTS, 'V');
    return verdict === 'ok'
      ? `The supply stays at or under ${l} DC (its high end is ${v}): safety extra-low voltage.`
      : `The supply can reach ${v}${toleranceText(ctx)}, above the ${l} DC limit of safety extra-low voltage. Such a build is outside this bench's low-voltage scope: it needs insulation and protection against touch, and belongs to someone qualified to build it.`;
  });
}

export function supplyVsDriverMax(ctx: KitContext, maxIn: number): Check {
  const high = ctx.supply.high;
  const verdict = verdictAtMost(high, maxIn);
  return check(ctx, 'supply-vs-driver-max', verdict, high, maxIn, 'V', () => {
    const [v, l] = formatPair(high, maxIn, 'V');
    return verdict === 'ok'
      ? `The supply's high end (${v}) is within the driver's ${l} input rating.`
      : `The supply can reach ${v}${toleranceText(ctx)}, above the driver's ${l} input rating. Choose a driver rated for at least ${formatVolts(ceilTo(high, 0.1))} in, or a supply of at most ${formatVolts(floorTo(maxIn / (1 + ctx.tol), 0.1))}.`;
  });
}

export function supplyVsDriverMin(ctx: KitContext, vLow: number, drop: number, minIn: number): Check {
  const verdict = verdictAtLeast(vLow, minIn);
  return check(ctx, 'supply-vs-driver-min', verdict, vLow, minIn, 'V', () => {
    const [v, l] = formatPair(vLow, minIn, 'V');
    return verdict === 'ok'
      ? `The supply's low end at the driver (${v}) reaches the driver's ${l} minimum input.`
      : `The supply's low end at the driver (${v}) is below the driver's ${l} minimum input. Use a supply of at least ${formatVolts(supplyForLowEnd(ctx, minIn, drop))}.`;
  });
}

/**
 * Enough voltage at the driver for the string plus what the driver itself needs (headroom for a buck,
 * dropout for a linear). Typical LEDs short of it: fail; worst-case LEDs short of it: caution (works on
 * most parts, may lose regulation on high-Vf ones).
 */
export function headroom(ctx: KitContext, vLow: number, drop: number, extra: number, extraName: 'headroom' | 'dropout'): Check {
  const { sv } = ctx;
  const needTyp = sv.typ + extra;
  const needMax = sv.max + extra;
  const verdict = verdictAtLeast(vLow, needTyp, needMax);
  return check(ctx, 'headroom', verdict, vLow, needMax, 'V', () => {
    const parts = (string: number) => ` (string ${formatVolts(string)} + ${formatVolts(extra)} ${extraName})`;
    const fit = Math.floor((vLow - extra) / ctx.spec.string.led.vfMax);
    const fewer = fit >= 1 && fit < ctx.spec.string.count ? `, or drive at most ${fit} LEDs from this one` : '';
    const advice = `Use a supply of at least ${formatVolts(supplyForLowEnd(ctx, needMax, drop))}${fewer}.`;
    const where = drop > 0 ? ' at the driver' : '';
    if (verdict === 'ok') {
      const [v, l] = formatPair(vLow, needMax, 'V');
      return `The supply's low end gives ${v}${where}; worst-case LEDs need ${l}${parts(sv.max)}.`;
    }
    if (verdict === 'caution') {
      const [v, l] = formatPair(vLow, needMax, 'V');
      return `Typical LEDs work, but worst-case ones need ${l}${parts(sv.max)} and the supply's low end gives ${v}${where}, so the current may sag. ${advice}`;
    }
    const [v, l] = formatPair(vLow, needTyp, 'V');
    return `The supply's low end gives ${v}${where}, short of the ${l} even typical LEDs need${parts(sv.typ)}. ${advice}`;
  });
}

/** Rule 3: the highest current through the LEDs (set current plus half the ripple) against their rating. */
export function ledCurrent(ctx: KitContext, peak: number, how: string, advice: string): Check {
  const { maxAmps } = ctx.spec.string.led;
  const verdict = verdictAtMost(peak, maxAmps);
  return check(ctx, 'led-current', verdict, peak, maxAmps, 'A', () => {
    const [v, l] = formatPair(peak, maxAmps, 'A');
    return verdict === 'ok'
      ? `${how} ${v} at most, within the LED's ${l} rating.`
      : `${how} ${v}, above the LED's ${l} rating; PWM dimming does not lower this peak. ${advice}`;
  });
}

/** Rule 4: worst-case power per LED against its rating; caution above 70 % (heat-sink it). */
export function ledPower(ctx: KitContext, watts: number, ampsThatFit: number): Check {
  const { maxWatts } = ctx.spec.string.led;
  const verdict = verdictAtMost(watts, maxWatts, LED_POWER_CAUTION_FRACTION * maxWatts);
  return check(ctx, 'led-power', verdict, watts, maxWatts, 'W', () => {
    const [v, l] = formatPair(watts, maxWatts, 'W');
    if (verdict === 'ok') return `Each LED takes at most ${v} of its ${l} rating.`;
    if (verdict === 'caution') {
      const [v7, l7] = formatPair(watts, LED_POWER_CAUTION_FRACTION * maxWatts, 'W');
      return `Each LED takes up to ${v7}, over 70 % of its ${l} rating (${l7}): mount the LEDs on a heat sink.`;
    }
    return `Each LED would take up to ${v} with worst-case forward voltage, above its ${l} rating. Lower the average current to at most ${formatAmps(ampsThatFit)}.`;
  });
}

/** Rule 5: worst-case average supply current; caution above 80 % of the rating. */
export function supplyCurrent(ctx: KitContext, amps: number): Check {
  const { maxAmps } = ctx.spec.supply;
  const verdict = verdictAtMost(amps, maxAmps, SUPPLY_CURRENT_CAUTION_FRACTION * maxAmps);
  return check(ctx, 'supply-current', verdict, amps, maxAmps, 'A', () => {
    const roomy = formatAmps(ceilTo(amps / SUPPLY_CURRENT_CAUTION_FRACTION, 0.1));
    const [v, l] = formatPair(amps, maxAmps, 'A');
    if (verdict === 'ok') return `The build draws at most ${v} of the supply's ${l}.`;
    if (verdict === 'caution') {
      const [v8] = formatPair(amps, SUPPLY_CURRENT_CAUTION_FRACTION * maxAmps, 'A');
      return `The build draws up to ${v8}, over 80 % of the supply's ${l}, leaving little reserve. A supply rated ${roomy} or more leaves room.`;
    }
    return `At worst the build needs ${v}, more than the supply's ${l}. Use a supply rated for at least ${roomy}.`;
  });
}

/**
 * The wire run. It fails only when the wire cannot deliver the driver's power at all (no real root of
 * I × (V − I × R) = P); a large but workable drop is reported with advice and does not change the verdict.
 */
export function wireDrop(ctx: KitContext, drop: number, collapsed: boolean, dropForLoopOhms: (ohms: number) => number): Check {
  const wiring = ctx.spec.wiring!;
  const verdict: Verdict = collapsed ? 'fail' : 'ok';
  const share = drop / ctx.supply.nominal;
  return check(ctx, 'wire-drop', verdict, drop, collapsed ? 0 : ctx.supply.low, 'V', () => {
    const run = `The ${formatSi(wiring.lengthMeters, 'm')} run of ${awgName(wiring.awg)} AWG`;
    const adviceLimit = WIRE_DROP_ADVICE_FRACTION * ctx.supply.nominal;
    const better = suggestAwg(wiring.lengthMeters, dropForLoopOhms, adviceLimit);
    const advice =
      better !== null
        ? `Use ${awgName(better)} AWG or thicker, or a shorter run.`
        : 'No common wire is thick enough for this run: move the supply closer to the driver.';
    if (collapsed)
      return `${run} has too much resistance (${formatSi(ctx.wireOhms, 'Ω')} out and back) to carry the driver's power at all. ${advice}`;
    const text = `${run} drops ${formatVolts(drop)} out and back (${formatPercent(share)} of the supply).`;
    return isAbove(drop, adviceLimit) ? `${text} Over 5 % is wasted as heat in the wire: ${advice}` : text;
  });
}

/** Rule 6: current density in the wire with the LEDs on; caution above 4 A/mm², fail above 10 A/mm². */
export function wireCurrentDensity(ctx: KitContext, ampsOn: number): Check {
  const wiring = ctx.spec.wiring!;
  const density = ampsOn / ctx.wireAreaMm2!;
  const verdict = verdictAtMost(density, WIRE_DENSITY_FAIL_A_PER_MM2, WIRE_DENSITY_CAUTION_A_PER_MM2);
  return check(ctx, 'wire-current-density', verdict, density, WIRE_DENSITY_FAIL_A_PER_MM2, 'A/mm²', () => {
    const gauge = `${awgName(wiring.awg)} AWG (${formatQuantity(ctx.wireAreaMm2!, 'mm²', 1)})`;
    let thinnest: number | undefined;
    for (let awg = MAX_AWG; awg >= MIN_AWG && thinnest === undefined; awg--)
      if (!isAbove(ampsOn / awgAreaMm2(awg), WIRE_DENSITY_CAUTION_A_PER_MM2)) thinnest = awg;
    const advice = thinnest !== undefined ? ` Use ${awgName(thinnest)} AWG or thicker.` : ' No common wire carries this current comfortably.';
    if (verdict === 'ok') return `${formatAmps(ampsOn)} in ${gauge} is ${formatQuantity(density, 'A/mm²')}, a comfortable density.`;
    if (verdict === 'caution') {
      const [v, l] = formatPair(density, WIRE_DENSITY_CAUTION_A_PER_MM2, 'A/mm²');
      return `${formatAmps(ampsOn)} in ${gauge} is ${v}, over ${l}: the wire will run warm, more so in a bundle.${advice}`;
    }
    const [v, l] = formatPair(density, WIRE_DENSITY_FAIL_A_PER_MM2, 'A/mm²');
    return `${formatAmps(ampsOn)} in ${gauge} is ${v}, over ${l}: the wire overheats.${advice}`;
  });
}

/** Rule 7: LED junction temperature from the worst-case LED power, through the board to the sink or air. */
export function ledJunction(ctx: KitContext, heatWatts: number): { check: Check; thermal: LedThermal } {
  const { spec } = ctx;
  const { maxJunctionC } = spec.string.led;
  const thermal = ledThermal(heatWatts, spec.string.count, spec.string.led, spec.ambientC, spec.heatSink);
  const tj = thermal.junctionC;
  const cautionAt = maxJunctionC - JUNCTION_CAUTION_MARGIN_C;
  const verdict = verdictAtMost(tj, maxJunctionC, cautionAt);
  const c = check(ctx, 'led-junction', verdict, tj, maxJunctionC, '°C', () => {
    const where = spec.heatSink
      ? `on ${spec.heatSink.count === 1 ? 'the kit’s heat sink' : `the kit’s ${spec.heatSink.count} heat sinks`} (sink at ${formatCelsius(thermal.sinkC!)})`
      : 'on bare star boards in still air';
    const needed = thermal.sinkCPerWNeeded;
    const sinkAdvice =
      needed !== undefined
        ? spec.heatSink
          ? ` A sink of at most ${sinkText(needed)} each keeps the junction at or under ${formatCelsius(cautionAt)}.`
          : ` Mount each LED on a heat sink of at most ${sinkText(needed)} (or share a larger one) to keep the junction at or under ${formatCelsius(cautionAt)}.`
        : ' No heat sink is enough at this power: lower the current or use LEDs rated for it.';
    if (verdict === 'ok') {
      const [v, l] = formatPair(tj, cautionAt, '°C');
      return `The LED junctions reach about ${v} ${where}, at least 25 °C under their ${formatCelsius(maxJunctionC)} maximum (${l}).`;
    }
    if (verdict === 'caution') {
      const [v, l] = formatPair(tj, cautionAt, '°C');
      return `The LED junctions reach about ${v} ${where}, within 25 °C of their ${formatCelsius(maxJunctionC)} maximum (over ${l}): heat shortens their life.${sinkAdvice}`;
    }
    const [v, l] = formatPair(tj, maxJunctionC, '°C');
    return `The LED junctions would reach about ${v} ${where}, above their ${l} maximum: they will fail early or at once.${sinkAdvice}`;
  });
  return { check: c, thermal };
}
