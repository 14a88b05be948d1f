// Bounds for the pruned ranking (rank.ts). For one driver and LED string: which supplies can pass at all,
// and an upper bound on a pair's margin — the smallest of the cheap checks' own margins, each computed
// exactly or with the supply's low end standing in for the (lower) voltage at the driver after the wire,
// which can only flatter the pair. A bound is never below the pair's true margin, so skipping pairs whose
// bound is under the bar never drops a pair the naive loop would rank.
import { relativeMargin } from './checks';
import { buckDuty, resistorAmps, stringVolts, worstBuckRippleAmps } from './circuit';
import type { ResolvedBuck, ResolvedDriver, ResolvedLinear, ResolvedResistor, ResolvedString, ResolvedSupply } from './schema';
import { HEAT_SINK_WATTS, RESISTOR_SPREAD_CAUTION_FRACTION, RIPPLE_CAUTION_FRACTION } from './thresholds';

export type PreparedSupply = { id: string; spec: ResolvedSupply; low: number; high: number };

export interface DriverPlan {
  /** Bound from the checks that depend on the driver alone, and the best any supply could do. */
  readonly driverBound: number;
  /** Supplies whose low end is under `lowFrom` or high end over `highTo` fail, or cannot reach `bar`. */
  window(bar: number): { lowFrom: number; highTo: number };
  /** Upper bound on the pair's margin, or null when the pair certainly fails. */
  bound(s: PreparedSupply): number | null;
}

// Bound once: these run millions of times and some module loaders put a getter on every import.
const margin = relativeMargin;
const duty = buckDuty;
const ampsThrough = resistorAmps;
const ripple = worstBuckRippleAmps;

// Rounding in the full check may differ from the bound's by an ulp or two; widen everything by this.
const SLACK = 1e-9;
const atMost = (value: number, limit: number) => margin('atMost', value, limit);
const atLeast = (value: number, limit: number) => margin('atLeast', value, limit);
const surelyOver = (value: number, limit: number) => value > limit * (1 + SLACK);
const widen = (b: number) => (Number.isFinite(b) ? b + SLACK * Math.max(1, Math.abs(b)) : b);
const lower = (x: number) => x - SLACK * Math.abs(x);
const raise = (x: number) => x + SLACK * Math.abs(x);

/**
 * The window for a bar. The low end must give `need` with margin (low − need) / need ≥ bar; the high end
 * must satisfy the high-side check, whose limit `highFor(bar)` the caller works out.
 */
function windowFor(lowFail: number, need: number, bar: number, highFor: (bar: number) => number) {
  const lowFrom = bar === -Infinity ? lowFail : Math.max(lowFail, need * (1 + bar));
  return { lowFrom: lower(lowFrom), highTo: raise(highFor(bar)) };
}
const shrink = (bar: number) => (bar === -Infinity ? 1 : Math.min(1, 1 - bar));

// Each driver plan below also bounds every supply at once. Two checks that pull opposite ways as the
// supply voltage x rises — one falling, one rising — are both met best where they cross; the value
// there (worked out in closed form, with the high end taken as low as the low end) bounds any supply.

class ResistorPlan implements DriverPlan {
  readonly driverBound: number;
  private readonly loop: number;
  constructor(
    private readonly d: ResolvedResistor,
    private readonly s: ResolvedString,
    private readonly sv: { min: number; typ: number; max: number },
    private readonly pwm: number,
    private readonly pwmGiven: boolean,
    wireOhms: number,
  ) {
    this.loop = d.ohms + wireOhms;
    // LED current 1 − (x − Vmin) / (loop × Imax) falls; headroom x / Vmax − 1 rises.
    const li = this.loop * s.led.maxAmps;
    const x = (2 + sv.min / li) / (1 / sv.max + 1 / li);
    this.driverBound = widen(x / sv.max - 1);
  }
  window(bar: number) {
    // LED current at the worst corner: (high − Vmin) / loop ≤ Imax × (1 − bar).
    return windowFor(this.sv.typ, this.sv.max, bar, (b) => this.sv.min + this.s.led.maxAmps * shrink(b) * this.loop);
  }
  bound(s: PreparedSupply): number | null {
    const { sv, pwm, loop, d } = this;
    const led = this.s.led;
    const ampsMax = ampsThrough(s.high, sv.min, loop);
    const ledWatts = led.vfTyp * pwm * ampsMax;
    const heat = pwm * ampsMax * ampsMax * d.ohms;
    const supplyAmps = pwm * ampsMax;
    if (surelyOver(ledWatts, led.maxWatts) || surelyOver(heat, d.watts) || surelyOver(supplyAmps, s.spec.maxAmps)) return null;
    const spreadLimit = RESISTOR_SPREAD_CAUTION_FRACTION * ampsThrough(s.spec.volts, sv.typ, loop);
    let b = Math.min(
      atLeast(s.low, sv.max + 0),
      atMost(ampsMax, led.maxAmps),
      atMost(ledWatts, led.maxWatts),
      atMost(heat, d.watts),
      atMost(supplyAmps, s.spec.maxAmps),
      atLeast(ampsThrough(s.low, sv.max, loop), spreadLimit),
    );
    if (this.pwmGiven) b = Math.min(b, atMost(ampsMax, s.spec.maxAmps));
    return widen(b);
  }
}

class LinearPlan implements DriverPlan {
  readonly driverBound: number;
  private readonly avg: number;
  private readonly need: number;
  private readonly heatLimit: number;
  constructor(
    private readonly d: ResolvedLinear,
    private readonly sv: { min: number; typ: number; max: number },
    ledBound: number,
    private readonly pwm: number,
    private readonly pwmGiven: boolean,
  ) {
    this.avg = pwm * d.outputAmps;
    this.need = sv.max + d.dropoutVolts;
    this.heatLimit = d.maxWatts ?? HEAT_SINK_WATTS;
    const M = d.maxInputVolts;
    const N = this.need;
    const a = this.avg / this.heatLimit;
    // input 1 − x / M against headroom x / N − 1 cross at (M − N) / (M + N);
    // heat 1 − (x − Vmin) × avg / W against headroom cross at x = (2 + Vmin × avg / W) / (1 / N + avg / W).
    const xHeat = (2 + sv.min * a) / (1 / N + a);
    this.driverBound = widen(Math.min(ledBound, (M - N) / (M + N), xHeat / N - 1));
  }
  window(bar: number) {
    return windowFor(this.sv.typ + this.d.dropoutVolts, this.need, bar, (b) => this.d.maxInputVolts * shrink(b));
  }
  bound(s: PreparedSupply): number | null {
    const { d, sv, avg } = this;
    const heat = Math.max(0, s.high - sv.min) * avg;
    if (surelyOver(avg, s.spec.maxAmps) || (d.maxWatts !== undefined && surelyOver(heat, d.maxWatts))) return null;
    let b = Math.min(
      this.driverBound,
      atMost(s.high, d.maxInputVolts),
      atLeast(s.low, this.need),
      atMost(heat, this.heatLimit),
      atMost(avg, s.spec.maxAmps),
    );
    if (this.pwmGiven) b = Math.min(b, atMost(d.outputAmps, s.spec.maxAmps));
    return widen(b);
  }
}

class BuckPlan implements DriverPlan {
  readonly driverBound: number;
  private readonly need: number;
  private readonly lowFail: number;
  private readonly inputWattsOn: number;
  constructor(
    private readonly d: ResolvedBuck,
    private readonly sv: { min: number; typ: number; max: number },
    ledBound: number,
    private readonly pwm: number,
    private readonly pwmGiven: boolean,
  ) {
    const eta = d.efficiency;
    this.need = sv.max + d.headroomVolts;
    this.inputWattsOn = (sv.typ * d.outputAmps) / eta;
    // Typical LEDs need typ + headroom, the minimum input, and a duty within the limit at the low end.
    this.lowFail = Math.max(sv.typ + d.headroomVolts, d.minInputVolts, sv.typ / (d.maxDuty * eta));
    const M = d.maxInputVolts;
    const N = this.need;
    // input 1 − x / M against headroom cross at (M − N) / (M + N); against duty 1 − Vmax / (x η Dmax)
    // at x = √(M × Vmax / (η Dmax)), where the input margin is 1 − x / M.
    const xDuty = Math.sqrt((M * sv.max) / (eta * d.maxDuty));
    this.driverBound = widen(Math.min(ledBound, (M - N) / (M + N), 1 - xDuty / M));
  }
  window(bar: number) {
    return windowFor(this.lowFail, this.need, bar, (b) => this.d.maxInputVolts * shrink(b));
  }
  bound(s: PreparedSupply): number | null {
    const { d, sv, pwm } = this;
    // At the supply's own low end the draw is the least it can be and the duty the lowest.
    const ampsOnAtLeast = this.inputWattsOn / s.low;
    if (surelyOver(pwm * ampsOnAtLeast, s.spec.maxAmps)) return null;
    let b = Math.min(
      this.driverBound,
      atMost(s.high, d.maxInputVolts),
      atLeast(s.low, d.minInputVolts),
      atLeast(s.low, this.need),
      atMost(duty(sv.max, s.low, d.efficiency), d.maxDuty),
      atMost(pwm * ampsOnAtLeast, s.spec.maxAmps),
    );
    if (d.inductorHenries !== undefined && d.switchingHz !== undefined)
      b = Math.min(b, atMost(ripple(s.high, sv, d.efficiency, d.inductorHenries, d.switchingHz), RIPPLE_CAUTION_FRACTION * d.outputAmps));
    if (this.pwmGiven) b = Math.min(b, atMost(ampsOnAtLeast, s.spec.maxAmps));
    return widen(b);
  }
}

/** The plan for one driver, or null when it fails with this string whatever the supply. */
export function planFor(d: ResolvedDriver, string: ResolvedString, pwmDuty: number | undefined, wireOhms: number): DriverPlan | null {
  const sv = stringVolts(string);
  const led = string.led;
  const pwm = pwmDuty ?? 1;
  const pwmGiven = pwmDuty !== undefined;
  if (d.type === 'resistor') return new ResistorPlan(d, string, sv, pwm, pwmGiven, wireOhms);

  // Driver alone: LED current and power per LED are exact and fixed.
  const ledWatts = led.vfTyp * pwm * d.outputAmps;
  if (surelyOver(d.outputAmps, led.maxAmps) || surelyOver(ledWatts, led.maxWatts)) return null;
  let ledBound = Math.min(atMost(d.outputAmps, led.maxAmps), atMost(ledWatts, led.maxWatts));
  if (d.type === 'linear') return new LinearPlan(d, sv, ledBound, pwm, pwmGiven);
  if (d.maxOutputVolts !== undefined) {
    if (surelyOver(sv.max, d.maxOutputVolts)) return null;
    ledBound = Math.min(ledBound, atMost(sv.max, d.maxOutputVolts));
  }
  return new BuckPlan(d, sv, ledBound, pwm, pwmGiven);
}
