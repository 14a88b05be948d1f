// Linear constant-current driver: a series pass element that burns the spare voltage as heat.
import type { Check } from './checks';
import { verdictAtMost } from './checks';
import { floorTo, formatAmps, formatCelsius, formatPair, formatVolts, formatWatts } from './format';
import { type KitContext, check, supplyForLowEnd } from './kitContext';
import type { DriverPart } from './report';
import type { ResolvedLinear } from './schema';
import {
  headroom,
  ledCurrent,
  ledJunction,
  ledPower,
  lowVoltageLimit,
  sinkText,
  supplyCurrent,
  supplyVsDriverMax,
  wireCurrentDensity,
  wireDrop,
} from './sharedChecks';
import { JUNCTION_CAUTION_MARGIN_C, REGULATOR_INTERFACE_C_PER_W, regulatorJunctionC } from './thermal';

export function linear(ctx: KitContext, d: ResolvedLinear): DriverPart {
  const { supply, sv, pwm, spec } = ctx;
  const led = spec.string.led;
  const amps = d.outputAmps;
  const avg = pwm * amps;
  // Rule 10: the string current flows straight through the wire run, so the drop is R × I while on.
  const drop = ctx.wireOhms * amps;
  const vDriver = supply.low - drop;
  // Rule 8: worst-case heat, supply at its high end and LEDs at their lowest forward voltage.
  const loss = Math.max(0, supply.high - sv.min) * avg;
  const junctionC = regulatorJunctionC(loss, spec.ambientC, d);
  const efficiency = Math.min(1, sv.typ / supply.nominal);
  const ledWatts = led.vfMax * avg;

  const checks: Check[] = [lowVoltageLimit(ctx), supplyVsDriverMax(ctx, d.maxInputVolts), headroom(ctx, vDriver, drop, d.dropoutVolts, 'dropout')];
  if (d.maxWatts !== undefined) checks.push(regulatorHeat(ctx, loss, d.maxWatts, d, avg, drop));
  checks.push(
    regulatorJunction(ctx, junctionC, loss, d, avg, drop),
    ledCurrent(ctx, amps, 'The driver sets', `Choose a driver of at most ${formatAmps(led.maxAmps)}.`),
    ledPower(ctx, ledWatts, led.maxWatts / led.vfMax),
    supplyCurrent(ctx, avg),
  );
  if (spec.wiring) checks.push(wireDrop(ctx, drop, false, (ohms) => ohms * amps), wireCurrentDensity(ctx, amps));
  const junction = ledJunction(ctx, ledWatts);
  checks.push(junction.check);

  return {
    checks,
    figures: {
      stringVoltsMin: sv.min,
      stringVoltsTyp: sv.typ,
      stringVoltsMax: sv.max,
      ledAmpsPeak: amps,
      ledAmpsAvg: avg,
      ledWatts,
      outputWatts: sv.max * avg,
      // The regulator passes the string current: the supply gives V × I, at worst its high end.
      inputWatts: supply.high * avg,
      supplyAmps: avg,
      lossWatts: loss,
      efficiency,
      ...(spec.wiring ? { wireDropVolts: drop } : {}),
      ledJunctionC: junction.thermal.junctionC,
      ...(junction.thermal.sinkC !== undefined ? { sinkC: junction.thermal.sinkC } : {}),
      ...(junction.thermal.sinkCPerWNeeded !== undefined ? { sinkCPerWNeeded: junction.thermal.sinkCPerWNeeded } : {}),
      regulatorJunctionC: junctionC,
    },
  };
}

/** A lower supply that still leaves the dropout wastes less: the range, when there is one. */
function lowerSupplyAdvice(ctx: KitContext, d: ResolvedLinear, okLoss: number, avg: number, drop: number): string {
  const highest = floorTo((ctx.sv.min + okLoss / avg) / (1 + ctx.tol), 0.1);
  const lowest = supplyForLowEnd(ctx, ctx.sv.max + d.dropoutVolts, drop);
  return highest >= lowest
    ? ` A supply between ${formatVolts(lowest)} and ${formatVolts(highest)} wastes less, or use a buck driver.`
    : ' A buck driver wastes far less.';
}

/** Rule 8, with a power rating: fail above it. */
function regulatorHeat(ctx: KitContext, loss: number, maxWatts: number, d: ResolvedLinear, avg: number, drop: number): Check {
  const verdict = verdictAtMost(loss, maxWatts);
  return check(ctx, 'regulator-heat', verdict, loss, maxWatts, 'W', () => {
    const [v, l] = formatPair(loss, maxWatts, 'W');
    return verdict === 'ok'
      ? `The driver turns at most ${v} into heat, within its ${l} rating.`
      : `The driver would turn up to ${v} into heat, above its ${l} rating.${lowerSupplyAdvice(ctx, d, maxWatts, avg, drop)}`;
  });
}

/** Rule 8: junction temperature through case, interface and sink, or in free air. */
function regulatorJunction(ctx: KitContext, tj: number, loss: number, d: ResolvedLinear, avg: number, drop: number): Check {
  const cautionAt = d.maxJunctionC - JUNCTION_CAUTION_MARGIN_C;
  const verdict = verdictAtMost(tj, d.maxJunctionC, cautionAt);
  return check(ctx, 'regulator-junction', verdict, tj, d.maxJunctionC, '°C', () => {
    const where = d.sinkCPerW !== undefined ? 'on its heat sink' : 'in free air (no heat sink given)';
    const room = cautionAt - ctx.spec.ambientC;
    const sinkNeeded = loss > 0 ? room / loss - d.junctionToCaseCPerW - REGULATOR_INTERFACE_C_PER_W : Infinity;
    const sinkAdvice =
      sinkNeeded > 0
        ? ` A heat sink of at most ${Number.isFinite(sinkNeeded) ? sinkText(sinkNeeded) : 'any size'} keeps it at or under ${formatCelsius(cautionAt)}.`
        : ' No heat sink is enough at this loss.';
    const lower = lowerSupplyAdvice(ctx, d, loss > 0 ? (loss * room) / Math.max(tj - ctx.spec.ambientC, Number.MIN_VALUE) : 0, avg, drop);
    if (verdict === 'ok') {
      const [v, l] = formatPair(tj, cautionAt, '°C');
      return `The driver loses at most ${formatWatts(loss)}; its junction reaches about ${v} ${where}, at least 25 °C under its ${formatCelsius(d.maxJunctionC)} maximum (${l}).`;
    }
    if (verdict === 'caution') {
      const [v, l] = formatPair(tj, cautionAt, '°C');
      return `The driver loses up to ${formatWatts(loss)}; its junction reaches about ${v} ${where}, within 25 °C of its ${formatCelsius(d.maxJunctionC)} maximum (over ${l}).${sinkAdvice}${lower}`;
    }
    const [v, l] = formatPair(tj, d.maxJunctionC, '°C');
    return `The driver would lose up to ${formatWatts(loss)}; its junction would reach about ${v} ${where}, above its ${l} maximum, and it will shut down or fail.${sinkAdvice}${lower}`;
  });
}
