// Series resistor: the simplest current limit, and the one most sensitive to supply and LED spread.
import type { Check, Verdict } from './checks';
import { isAbove, verdictAtMost } from './checks';
import { resistorAmps } from './circuit';
import { nearestAtOrAbove, wattageAtOrAbove } from './eSeries';
import { formatAmps, formatPair, formatSi, formatVolts, formatWatts } from './format';
import { type KitContext, check } from './kitContext';
import type { DriverPart } from './report';
import type { ResolvedResistor } from './schema';
import { ledCurrent, ledJunction, ledPower, lowVoltageLimit, supplyCurrent, wireCurrentDensity, wireDrop } from './sharedChecks';
import { RESISTOR_DERATING_FRACTION } from './thresholds';

/**
 * Rule 4 for a resistor: the LED power vf × (V − N × vf) / R is largest at one of the forward-voltage
 * corners we know; take the largest of the three at the supply's high end.
 */
export function resistorLedWatts(vHigh: number, count: number, vfs: number[], ohms: number): number {
  return Math.max(...vfs.map((vf) => vf * resistorAmps(vHigh, count * vf, ohms)));
}

export function resistor(ctx: KitContext, d: ResolvedResistor): DriverPart {
  const { supply, sv, pwm, spec } = ctx;
  const led = spec.string.led;
  // The wire run would add to the loop's resistance and lower the current, but the worst case is the
  // shortest, thickest run: rule 9 takes the resistor alone, R = driver.ohms (the wire only adds its drop).
  const loop = d.ohms;
  // Rule 9: typical current at the nominal supply; the worst corner (supply high, LEDs at vfMin).
  const ampsTyp = (supply.nominal - sv.typ) / loop;
  const ampsMax = resistorAmps(supply.high, sv.min, loop);
  const heat = ampsMax * ampsMax * d.ohms;
  const ledWatts = pwm * resistorLedWatts(supply.high, spec.string.count, [led.vfMin, led.vfTyp, led.vfMax], loop);
  const drop = ctx.wireOhms * ampsMax;
  const avg = pwm * ampsMax;

  const checks: Check[] = [
    lowVoltageLimit(ctx),
    typicalCurrent(ctx, ampsTyp),
    // The advice (an E24 search) is words only: skipped when the ranking runs without them.
    ledCurrent(ctx, ampsMax, 'At worst (supply high, low-Vf LEDs) the resistor lets', ctx.words ? resistorAdvice(ctx) : ''),
    resistorPower(ctx, heat, d.watts),
    ledPower(ctx, ledWatts, led.maxWatts / led.vfMax),
    supplyCurrent(ctx, avg),
  ];
  if (spec.wiring)
    checks.push(
      wireDrop(ctx, drop, false, (ohms) => ohms * resistorAmps(supply.high, sv.min, d.ohms + ohms)),
      wireCurrentDensity(ctx, ampsMax),
    );
  const junction = ledJunction(ctx, ledWatts);
  checks.push(junction.check);

  return {
    checks,
    figures: {
      stringVoltsMin: sv.min,
      stringVoltsTyp: sv.typ,
      stringVoltsMax: sv.max,
      ledAmpsPeak: ampsMax,
      ledAmpsAvg: avg,
      ledWatts,
      outputWatts: spec.string.count * ledWatts,
      inputWatts: supply.high * avg,
      supplyAmps: avg,
      lossWatts: pwm * heat,
      efficiency: Math.min(1, sv.typ / supply.nominal),
      resistorAmpsMax: ampsMax,
      ...(spec.wiring ? { wireDropVolts: drop } : {}),
      ledJunctionC: junction.thermal.junctionC,
      ...(junction.thermal.sinkC !== undefined ? { sinkC: junction.thermal.sinkC } : {}),
      ...(junction.thermal.sinkCPerWNeeded !== undefined ? { sinkCPerWNeeded: junction.thermal.sinkCPerWNeeded } : {}),
    },
  };
}

function resistorAdvice(ctx: KitContext): string {
  const { maxAmps } = ctx.spec.string.led;
  const neededOhms = (ctx.supply.high - ctx.sv.min) / maxAmps;
  return neededOhms >= 0.01 && neededOhms <= 1e7
    ? `Use at least ${formatSi(nearestAtOrAbove(neededOhms), 'Ω')} (next E24 value up).`
    : 'Use a constant-current driver instead.';
}

/** Rule 9: with typical LEDs at the nominal supply some current must flow, or the LEDs stay dark. */
function typicalCurrent(ctx: KitContext, ampsTyp: number): Check {
  const { supply, sv } = ctx;
  // Compared as voltages, with the tolerance: a supply equal to N × Vf,typ gives no current → fail.
  const verdict: Verdict = isAbove(supply.nominal, sv.typ) ? 'ok' : 'fail';
  const value = verdict === 'fail' ? Math.min(0, ampsTyp) : ampsTyp;
  return check(ctx, 'typical-current', verdict, value, 0, 'A', () => {
    const [v, l] = formatPair(supply.nominal, sv.typ, 'V');
    return verdict === 'ok'
      ? `With typical LEDs the resistor passes ${formatAmps(ampsTyp)} at the nominal ${v}.`
      : `The nominal supply (${v}) is not above the typical string voltage (${l}): typical LEDs stay dark or barely glow. Use a supply of at least ${formatVolts(sv.max + 1)}, or fewer LEDs.`;
  });
}

function resistorPower(ctx: KitContext, heat: number, rating: number): Check {
  const verdict = verdictAtMost(heat, rating, RESISTOR_DERATING_FRACTION * rating);
  return check(ctx, 'resistor-power', verdict, heat, rating, 'W', () => {
    const buy = wattageAtOrAbove(heat / RESISTOR_DERATING_FRACTION);
    const advice =
      buy !== null ? `Use a resistor rated ${formatWatts(buy)} or more.` : 'That is too much heat for a resistor: use a constant-current driver.';
    const [v, l] = formatPair(heat, rating, 'W');
    if (verdict === 'ok') return `The resistor dissipates at most ${v}, no more than half its ${l} rating.`;
    if (verdict === 'caution')
      return `The resistor dissipates up to ${v}, more than half its ${l} rating, so it will run hot. ${advice}`;
    return `The resistor would dissipate up to ${v}, above its ${l} rating. ${advice}`;
  });
}

