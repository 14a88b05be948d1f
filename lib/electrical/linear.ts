// Linear constant-current driver: a series pass element that burns the spare voltage as heat.
import type { Check } from './checks';
import { verdictAtMost } from './checks';
import { floorTo, formatVolts, formatWatts } from './format';
import { type KitContext, check, ledFigures, supplyForLowEnd } from './kitContext';
import type { DriverPart } from './report';
import type { ResolvedLinear } from './schema';
import {
  headroom,
  ledCurrentFromDriver,
  ledPower,
  supplyCurrent,
  supplyPeak,
  supplyVsDriverMax,
  wireDrop,
} from './sharedChecks';
import { HEAT_SINK_WATTS, REGULATOR_HEAT_CAUTION_FRACTION } from './thresholds';

export function linear(ctx: KitContext, d: ResolvedLinear): DriverPart {
  const { supply, sv, pwm, spec } = ctx;
  const amps = d.outputAmps;
  const avg = pwm * amps;
  // The string current flows straight through the wire run: its drop is R × I.
  const drop = ctx.wireOhms * amps;
  const vLow = supply.low - drop;
  // Worst-case heat: supply at its high end, LEDs at their lowest forward voltage.
  const heat = Math.max(0, supply.high - sv.min) * avg;
  const efficiency = Math.min(1, sv.typ / supply.nominal);
  const leds = ledFigures(ctx, amps);

  const checks: Check[] = [
    supplyVsDriverMax(ctx, d.maxInputVolts),
    headroom(ctx, vLow, drop, d.dropoutVolts, 'dropout'),
    regulatorHeat(ctx, heat, d, avg, drop),
    ledCurrentFromDriver(ctx, amps),
    ledPower(ctx, amps),
    supplyCurrent(ctx, avg),
  ];
  if (spec.pwmDuty !== undefined) checks.push(supplyPeak(ctx, amps));
  if (spec.wiring) checks.push(wireDrop(ctx, drop, vLow <= 0, (ohms) => ohms * amps));

  return {
    checks,
    figures: {
      ...leds,
      inputWatts: leds.outputWatts / efficiency,
      supplyAmps: avg,
      lossWatts: heat,
      efficiency,
      ...(spec.wiring ? { wireDropVolts: drop } : {}),
    },
  };
}

function regulatorHeat(ctx: KitContext, heat: number, d: ResolvedLinear, avg: number, drop: number): Check {
  const { sv } = ctx;
  const { maxWatts } = d;
  const okHeat = maxWatts !== undefined ? REGULATOR_HEAT_CAUTION_FRACTION * maxWatts : HEAT_SINK_WATTS;
  const verdict = maxWatts !== undefined ? verdictAtMost(heat, maxWatts, okHeat) : verdictAtMost(heat, Infinity, okHeat);
  const limit = maxWatts ?? HEAT_SINK_WATTS;
  return check(ctx, 'regulator-heat', verdict, heat, limit, 'W', () => {
    // Advice: the highest supply that keeps the heat at the ok level, if that still leaves enough dropout.
    const highest = floorTo((sv.min + okHeat / avg) / (1 + ctx.tol), 0.1);
    const lowest = supplyForLowEnd(ctx, sv.max + d.dropoutVolts, drop);
    const lower =
      highest >= lowest
        ? ` A supply between ${formatVolts(lowest)} and ${formatVolts(highest)} wastes less, or use a buck driver.`
        : ' A buck driver wastes far less.';
    if (maxWatts === undefined)
      return verdict === 'ok'
        ? `The driver turns at most ${formatWatts(heat)} into heat, small enough without a heat sink.`
        : `The driver turns up to ${formatWatts(heat)} into heat; above about 1 W it needs a heat sink.${lower}`;
    if (verdict === 'ok') return `The driver turns at most ${formatWatts(heat)} into heat, within its ${formatWatts(maxWatts)} rating.`;
    if (verdict === 'caution')
      return `The driver turns up to ${formatWatts(heat)} into heat, over 70 % of its ${formatWatts(maxWatts)} rating: mount it on a heat sink.${lower}`;
    return `The driver would turn up to ${formatWatts(heat)} into heat, above its ${formatWatts(maxWatts)} rating.${lower}`;
  });
}
