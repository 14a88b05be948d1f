// Buck (step-down) constant-current driver.
import type { Check, Verdict } from './checks';
import { verdictAtMost } from './checks';
import { buckDuty, constantPowerInputVolts, worstBuckRippleAmps } from './circuit';
import { ceilTo, formatAmps, formatPercent, formatSi, formatVolts } from './format';
import { type KitContext, check, ledFigures, supplyForLowEnd } from './kitContext';
import type { DriverPart } from './report';
import type { ResolvedBuck } from './schema';
import {
  headroom,
  ledCurrentFromDriver,
  ledPower,
  supplyCurrent,
  supplyPeak,
  supplyVsDriverMax,
  supplyVsDriverMin,
  wireDrop,
} from './sharedChecks';
import { RIPPLE_CAUTION_FRACTION } from './thresholds';

export function buck(ctx: KitContext, d: ResolvedBuck): DriverPart {
  const { supply, sv, pwm, spec } = ctx;
  const amps = d.outputAmps;
  const eta = d.efficiency;

  // During each PWM pulse the driver draws its full power; the wire drop then is at its largest.
  const inputWattsOn = (sv.typ * amps) / eta;
  const atDriver = constantPowerInputVolts(supply.low, ctx.wireOhms, inputWattsOn);
  const vLow = atDriver.volts;
  const supplyAmpsOn = atDriver.collapsed ? supply.low / (2 * ctx.wireOhms) : inputWattsOn / vLow;
  const drop = supply.low - vLow;

  const dutyMax = buckDuty(sv.max, vLow, eta);
  const dutyTyp = buckDuty(sv.typ, vLow, eta);
  const leds = ledFigures(ctx, amps);
  const inputWatts = leds.outputWatts / eta;

  const checks: Check[] = [
    supplyVsDriverMax(ctx, d.maxInputVolts),
    supplyVsDriverMin(ctx, vLow, drop, d.minInputVolts),
    headroom(ctx, vLow, drop, d.headroomVolts, 'headroom'),
    dutyCheck(ctx, d, dutyTyp, dutyMax, drop),
  ];
  if (d.maxOutputVolts !== undefined) checks.push(driverMaxOutput(ctx, d.maxOutputVolts));

  let rippleAmps: number | undefined;
  if (d.inductorHenries !== undefined && d.switchingHz !== undefined) {
    rippleAmps = worstBuckRippleAmps(supply.high, sv, eta, d.inductorHenries, d.switchingHz);
    checks.push(rippleCheck(ctx, rippleAmps, amps, d.inductorHenries));
  }

  checks.push(ledCurrentFromDriver(ctx, amps), ledPower(ctx, amps), supplyCurrent(ctx, pwm * supplyAmpsOn));
  if (spec.pwmDuty !== undefined) checks.push(supplyPeak(ctx, supplyAmpsOn));
  if (spec.wiring)
    checks.push(
      wireDrop(ctx, drop, atDriver.collapsed, (ohms) => supply.low - constantPowerInputVolts(supply.low, ohms, inputWattsOn).volts),
    );

  return {
    checks,
    figures: {
      ...leds,
      inputWatts,
      supplyAmps: pwm * supplyAmpsOn,
      lossWatts: inputWatts - leds.outputWatts,
      efficiency: eta,
      duty: dutyMax,
      ...(rippleAmps !== undefined ? { rippleAmps } : {}),
      ...(spec.wiring ? { wireDropVolts: drop } : {}),
    },
  };
}

/** Typical LEDs beyond the duty limit: fail; worst-case ones: caution (same split as headroom). */
function dutyCheck(ctx: KitContext, d: ResolvedBuck, dutyTyp: number, dutyMax: number, drop: number): Check {
  const verdict: Verdict = dutyTyp > d.maxDuty || Number.isNaN(dutyTyp) ? 'fail' : dutyMax > d.maxDuty ? 'caution' : 'ok';
  return check(ctx, 'duty', verdict, dutyMax, d.maxDuty, 'ratio', () => {
    const enough = formatVolts(supplyForLowEnd(ctx, ctx.sv.max / (d.maxDuty * d.efficiency), drop));
    const limitText = formatPercent(d.maxDuty);
    if (verdict === 'ok') return `Worst-case duty is ${formatPercent(dutyMax)}, within the driver's ${limitText} limit.`;
    if (verdict === 'caution')
      return `Typical LEDs need a duty of ${formatPercent(dutyTyp)}, but worst-case ones need ${formatPercent(dutyMax)} at the supply's low end, above the driver's ${limitText} limit, so the current may sag. A supply of at least ${enough} clears it.`;
    return `Even typical LEDs need a duty of ${formatPercent(dutyTyp)}, above the driver's ${limitText} limit. Use a supply of at least ${enough}, or fewer LEDs.`;
  });
}

function driverMaxOutput(ctx: KitContext, maxOut: number): Check {
  const { sv } = ctx;
  const verdict = verdictAtMost(sv.max, maxOut);
  return check(ctx, 'driver-max-output', verdict, sv.max, maxOut, 'V', () => {
    if (verdict === 'ok')
      return `The string needs at most ${formatVolts(sv.max)}, within the driver's ${formatVolts(maxOut)} output range.`;
    const fit = Math.floor(maxOut / ctx.spec.string.led.vfMax);
    return (
      `Worst-case LEDs need up to ${formatVolts(sv.max)}, beyond the driver's ${formatVolts(maxOut)} output limit. ` +
      (fit >= 1 ? `Use at most ${fit} LEDs per string, or ` : 'Use ') +
      `a driver that can give at least ${formatVolts(ceilTo(sv.max, 0.1))} out.`
    );
  });
}

function rippleCheck(ctx: KitContext, ripple: number, amps: number, henries: number): Check {
  const limit = RIPPLE_CAUTION_FRACTION * amps;
  const verdict = verdictAtMost(ripple, Infinity, limit);
  return check(ctx, 'ripple', verdict, ripple, limit, 'A', () => {
    const share = formatPercent(ripple / amps);
    return verdict === 'ok'
      ? `Inductor ripple is at most ${formatAmps(ripple)} peak to peak (${share} of the output current), within 40 %.`
      : `Inductor ripple reaches ${formatAmps(ripple)} peak to peak, ${share} of the output current; above 40 % the LEDs see large current swings. An inductor of at least ${formatSi((henries * ripple) / limit, 'H')} or a faster switching frequency brings it down.`;
  });
}
