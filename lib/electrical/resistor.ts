// Series resistor: the simplest current limit, and the one most sensitive to supply and LED spread.
import type { Check } from './checks';
import { verdictAtLeast, verdictAtMost } from './checks';
import { resistorAmps } from './circuit';
import { nearestAtOrAbove, wattageAtOrAbove } from './eSeries';
import { formatAmps, formatSi, formatWatts } from './format';
import { type KitContext, check, ledFigures } from './kitContext';
import type { DriverPart } from './report';
import type { ResolvedResistor } from './schema';
import { headroom, ledPower, supplyCurrent, supplyPeak, wireDrop } from './sharedChecks';
import { RESISTOR_DERATING_FRACTION, RESISTOR_SPREAD_CAUTION_FRACTION } from './thresholds';

export function resistor(ctx: KitContext, d: ResolvedResistor): DriverPart {
  const { supply, sv, pwm, spec } = ctx;
  // The wire run is part of the series loop, so it adds to the resistance.
  const loop = d.ohms + ctx.wireOhms;
  const ampsTyp = resistorAmps(supply.nominal, sv.typ, loop);
  const ampsMax = resistorAmps(supply.high, sv.min, loop);
  const ampsLow = resistorAmps(supply.low, sv.max, loop);
  const dropLow = ctx.wireOhms * ampsLow;
  const vLow = supply.low - dropLow;
  const heatMax = pwm * ampsMax * ampsMax * d.ohms;
  const efficiency = Math.min(1, sv.typ / supply.nominal);
  const leds = ledFigures(ctx, ampsTyp);

  const checks: Check[] = [
    headroom(ctx, vLow, dropLow, 0, null),
    resistorPower(ctx, heatMax, d.watts),
    resistorSpread(ctx, ampsLow, ampsTyp, ampsMax),
    ledCurrentWorstCorner(ctx, ampsMax),
    ledPower(ctx, ampsMax),
    supplyCurrent(ctx, pwm * ampsMax),
  ];
  if (spec.pwmDuty !== undefined) checks.push(supplyPeak(ctx, ampsMax));
  if (spec.wiring)
    checks.push(
      wireDrop(ctx, ctx.wireOhms * ampsMax, false, (ohms) => ohms * resistorAmps(supply.high, sv.min, d.ohms + ohms)),
    );

  return {
    checks,
    figures: {
      ...leds,
      inputWatts: leds.outputWatts / efficiency,
      supplyAmps: leds.ledAmpsAvg,
      lossWatts: heatMax,
      efficiency,
      resistorAmpsMax: ampsMax,
      ...(spec.wiring ? { wireDropVolts: ctx.wireOhms * ampsMax } : {}),
    },
  };
}

function ledCurrentWorstCorner(ctx: KitContext, ampsMax: number): Check {
  const { maxAmps } = ctx.spec.string.led;
  const verdict = verdictAtMost(ampsMax, maxAmps);
  return check(ctx, 'led-current', verdict, ampsMax, maxAmps, 'A', () => {
    const through = `At worst (supply high, low-Vf LEDs) the resistor lets ${formatAmps(ampsMax)} through`;
    if (verdict === 'ok') return `${through}, within the LED's ${formatAmps(maxAmps)} rating.`;
    const neededOhms = (ctx.supply.high - ctx.sv.min) / maxAmps - ctx.wireOhms;
    const advice =
      neededOhms > 0 && Number.isFinite(neededOhms)
        ? `Use at least ${formatSi(nearestAtOrAbove(neededOhms), 'Ω')} (next E24 value up).`
        : 'Use a constant-current driver instead.';
    return `${through}, above the LED's ${formatAmps(maxAmps)} rating. ${advice}`;
  });
}

function resistorPower(ctx: KitContext, heat: number, rating: number): Check {
  const verdict = verdictAtMost(heat, rating, RESISTOR_DERATING_FRACTION * rating);
  return check(ctx, 'resistor-power', verdict, heat, rating, 'W', () => {
    const buy = wattageAtOrAbove(heat / RESISTOR_DERATING_FRACTION);
    const advice =
      buy !== null ? `Use a resistor rated ${formatWatts(buy)} or more.` : 'That is too much heat for a resistor: use a constant-current driver.';
    if (verdict === 'ok') return `The resistor dissipates at most ${formatWatts(heat)}, no more than half its ${formatWatts(rating)} rating.`;
    if (verdict === 'caution')
      return `The resistor dissipates up to ${formatWatts(heat)}, more than half its ${formatWatts(rating)} rating, so it will run hot. ${advice}`;
    return `The resistor would dissipate up to ${formatWatts(heat)}, above its ${formatWatts(rating)} rating. ${advice}`;
  });
}

function resistorSpread(ctx: KitContext, ampsLow: number, ampsTyp: number, ampsMax: number): Check {
  const limit = RESISTOR_SPREAD_CAUTION_FRACTION * ampsTyp;
  const verdict = verdictAtLeast(ampsLow, -Infinity, limit);
  return check(ctx, 'resistor-spread', verdict, ampsLow, limit, 'A', () =>
    verdict === 'ok'
      ? `Across the supply and LED spread the current stays between ${formatAmps(ampsLow)} and ${formatAmps(ampsMax)}.`
      : `At the supply's low end with high-Vf LEDs the current falls to ${formatAmps(ampsLow)}, under half the typical ${formatAmps(ampsTyp)}, so brightness will vary. More supply headroom or a constant-current driver evens it out.`,
  );
}
