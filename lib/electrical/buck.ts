// Buck (step-down) constant-current driver: a constant-power load on the supply.
import type { Check, Verdict } from './checks';
import { isBelow, verdictAtMost } from './checks';
import { buckDuty, constantPowerDraw, worstBuckRippleAmps } from './circuit';
import { ceilTo, formatAmps, formatPair, formatPercent, formatSi, formatVolts } from './format';
import { type KitContext, check, supplyForLowEnd } from './kitContext';
import type { DriverPart } from './report';
import type { ResolvedBuck } from './schema';
import {
  headroom,
  ledCurrent,
  ledJunction,
  ledPower,
  lowVoltageLimit,
  supplyCurrent,
  supplyVsDriverMax,
  supplyVsDriverMin,
  wireCurrentDensity,
  wireDrop,
} from './sharedChecks';
import { CCM_LIMIT_RIPPLE_FRACTION, RIPPLE_CAUTION_FRACTION } from './thresholds';

export function buck(ctx: KitContext, d: ResolvedBuck): DriverPart {
  const { supply, sv, pwm, spec } = ctx;
  const led = spec.string.led;
  const amps = d.outputAmps;
  const eta = d.efficiency;
  const avg = pwm * amps;

  // Rule 2: ripple at the supply's high end; the LEDs see the set current plus half of it.
  const rippleAmps =
    d.inductorHenries !== undefined && d.switchingHz !== undefined
      ? worstBuckRippleAmps(supply.high, sv, eta, d.inductorHenries, d.switchingHz)
      : undefined;
  const peak = amps + (rippleAmps ?? 0) / 2;

  // Rule 5: worst-case power (string at its maximum), drawn at the supply's low end.
  const outputWatts = sv.max * avg;
  const inputWatts = outputWatts / eta;
  const average = constantPowerDraw(supply.low, ctx.wireOhms, inputWatts);
  // Rule 10: while the LEDs are on (PWM aside) the driver draws its full power; the wire drop then is
  // at its largest and the driver sees the least voltage.
  const on = constantPowerDraw(supply.low, ctx.wireOhms, (sv.max * amps) / eta);
  const vDriver = on.volts;
  const drop = supply.low - vDriver;

  const dutyMax = buckDuty(sv.max, vDriver, eta);
  const dutyTyp = buckDuty(sv.typ, vDriver, eta);
  const ledWatts = led.vfMax * avg;

  const checks: Check[] = [
    lowVoltageLimit(ctx),
    supplyVsDriverMax(ctx, d.maxInputVolts),
    supplyVsDriverMin(ctx, vDriver, drop, d.minInputVolts),
    headroom(ctx, vDriver, drop, d.headroomVolts, 'headroom'),
    dutyCheck(ctx, d, dutyTyp, dutyMax, drop),
  ];
  if (d.maxOutputVolts !== undefined) checks.push(driverMaxOutput(ctx, d.maxOutputVolts));
  if (rippleAmps !== undefined) checks.push(rippleCheck(ctx, rippleAmps, amps, d.inductorHenries!));
  const how = rippleAmps !== undefined ? 'With ripple the LEDs see' : 'The driver sets';
  const advice = !ctx.words
    ? ''
    : amps > led.maxAmps
      ? `Choose a driver of at most ${formatAmps(led.maxAmps)}.`
      : `Lower the ripple (a larger inductor or a faster switching frequency) or choose a driver of at most ${formatAmps(led.maxAmps - (rippleAmps ?? 0) / 2)}.`;
  checks.push(ledCurrent(ctx, peak, how, advice));
  if (d.inductorSatAmps !== undefined) checks.push(inductorSaturation(ctx, peak, d.inductorSatAmps));
  checks.push(ledPower(ctx, ledWatts, led.maxWatts / led.vfMax), supplyCurrent(ctx, average.amps));
  if (spec.wiring) {
    const wattsOn = (sv.max * amps) / eta;
    checks.push(
      wireDrop(ctx, drop, on.collapsed, (ohms) => supply.low - constantPowerDraw(supply.low, ohms, wattsOn).volts),
      wireCurrentDensity(ctx, on.amps),
    );
  }
  const junction = ledJunction(ctx, ledWatts);
  checks.push(junction.check);

  return {
    checks,
    figures: {
      stringVoltsMin: sv.min,
      stringVoltsTyp: sv.typ,
      stringVoltsMax: sv.max,
      ledAmpsPeak: peak,
      ledAmpsAvg: avg,
      ledWatts,
      outputWatts,
      inputWatts,
      supplyAmps: average.amps,
      lossWatts: inputWatts - outputWatts,
      efficiency: eta,
      duty: dutyMax,
      ...(rippleAmps !== undefined ? { rippleAmps } : {}),
      ...(spec.wiring ? { wireDropVolts: drop } : {}),
      ledJunctionC: junction.thermal.junctionC,
      ...(junction.thermal.sinkC !== undefined ? { sinkC: junction.thermal.sinkC } : {}),
      ...(junction.thermal.sinkCPerWNeeded !== undefined ? { sinkCPerWNeeded: junction.thermal.sinkCPerWNeeded } : {}),
    },
  };
}

/** Typical LEDs beyond the duty limit: fail; worst-case ones: caution (same split as headroom). */
function dutyCheck(ctx: KitContext, d: ResolvedBuck, dutyTyp: number, dutyMax: number, drop: number): Check {
  const typVerdict = verdictAtMost(dutyTyp, d.maxDuty);
  const verdict: Verdict = typVerdict === 'fail' ? 'fail' : verdictAtMost(dutyMax, d.maxDuty) === 'fail' ? 'caution' : 'ok';
  return check(ctx, 'duty', verdict, dutyMax, d.maxDuty, 'ratio', () => {
    const enough = formatVolts(supplyForLowEnd(ctx, ctx.sv.max / (d.maxDuty * d.efficiency), drop));
    if (verdict === 'ok') {
      const [v, l] = formatPair(dutyMax, d.maxDuty, 'ratio');
      return `Worst-case duty is ${v}, within the driver's ${l} limit.`;
    }
    if (verdict === 'caution') {
      const [v, l] = formatPair(dutyMax, d.maxDuty, 'ratio');
      return `Typical LEDs need a duty of ${formatPercent(dutyTyp)}, but worst-case ones need ${v} at the supply's low end, above the driver's ${l} limit, so the current may sag. A supply of at least ${enough} clears it.`;
    }
    const [v, l] = formatPair(dutyTyp, d.maxDuty, 'ratio');
    return `Even typical LEDs need a duty of ${v}, above the driver's ${l} limit. Use a supply of at least ${enough}, or fewer LEDs.`;
  });
}

function driverMaxOutput(ctx: KitContext, maxOut: number): Check {
  const { sv } = ctx;
  const verdict = verdictAtMost(sv.max, maxOut);
  return check(ctx, 'driver-max-output', verdict, sv.max, maxOut, 'V', () => {
    const [v, l] = formatPair(sv.max, maxOut, 'V');
    if (verdict === 'ok') return `The string needs at most ${v}, within the driver's ${l} output range.`;
    const fit = Math.floor(maxOut / ctx.spec.string.led.vfMax);
    return (
      `Worst-case LEDs need up to ${v}, beyond the driver's ${l} output limit. ` +
      (fit >= 1 ? `Use at most ${fit} LEDs per string, or ` : 'Use ') +
      `a driver that can give at least ${formatVolts(ceilTo(sv.max, 0.1))} out.`
    );
  });
}

/**
 * Rule 2: ripple above 40 % of the output current is a caution; at twice the output current the inductor
 * current touches zero each cycle, the converter leaves continuous conduction and the formulas (and
 * the set current) no longer hold — also a caution, said plainly.
 */
function rippleCheck(ctx: KitContext, ripple: number, amps: number, henries: number): Check {
  const limit = RIPPLE_CAUTION_FRACTION * amps;
  const discontinuous = !isBelow(ripple, CCM_LIMIT_RIPPLE_FRACTION * amps);
  const verdict = verdictAtMost(ripple, Infinity, limit);
  return check(ctx, 'ripple', verdict, ripple, limit, 'A', () => {
    const share = formatPercent(ripple / amps);
    const [v, l] = formatPair(ripple, limit, 'A');
    const better = `An inductor of at least ${formatSi((henries * ripple) / limit, 'H')} or a faster switching frequency brings it down.`;
    if (discontinuous)
      return `Inductor ripple reaches ${v} peak to peak, ${share} of the output current: at twice the output current the inductor current falls to zero each cycle, the converter leaves continuous conduction and these figures no longer hold. ${better}`;
    return verdict === 'ok'
      ? `Inductor ripple is at most ${v} peak to peak (${share} of the output current), within 40 % (${l}).`
      : `Inductor ripple reaches ${v} peak to peak, ${share} of the output current (over ${l}, 40 %): the LEDs see large current swings. ${better}`;
  });
}

/** Rule 3: the inductor must carry the peak current without saturating. */
function inductorSaturation(ctx: KitContext, peak: number, sat: number): Check {
  const verdict = verdictAtMost(peak, sat);
  return check(ctx, 'inductor-saturation', verdict, peak, sat, 'A', () => {
    const [v, l] = formatPair(peak, sat, 'A');
    return verdict === 'ok'
      ? `The inductor's peak current (${v}) is within its ${l} saturation rating.`
      : `The inductor's peak current (${v}) is above its ${l} saturation rating: its inductance collapses and the current spikes. Use an inductor rated for at least ${formatAmps(ceilTo(peak, 0.1))}.`;
  });
}
