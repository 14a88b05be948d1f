// The small circuit formulas the check is built from. Each is tested against its source in
// tests/unit/electrical/circuit.test.ts.
import type { ResolvedString, ResolvedSupply } from './schema';

export type SupplyWindow = { nominal: number; low: number; high: number };
export type StringVolts = { min: number; typ: number; max: number };

/** The band a supply's output can sit anywhere in: nominal × (1 ± tolerance). */
export function supplyWindow(supply: Pick<ResolvedSupply, 'volts' | 'tolerancePct'>): SupplyWindow {
  const t = supply.tolerancePct / 100;
  return { nominal: supply.volts, low: supply.volts * (1 - t), high: supply.volts * (1 + t) };
}

/** Series string: forward voltages add (Kirchhoff's voltage law). */
export function stringVolts(string: { count: number; led: Pick<ResolvedString['led'], 'vfMin' | 'vfTyp' | 'vfMax'> }): StringVolts {
  const { count, led } = string;
  return { min: count * led.vfMin, typ: count * led.vfTyp, max: count * led.vfMax };
}

/** Buck duty cycle including losses: D = Vout / (Vin × η). */
export function buckDuty(vout: number, vin: number, efficiency: number): number {
  return vout / (vin * efficiency);
}

/** Buck inductor ripple, peak to peak: ΔI = (Vin − Vout) × D / (L × f), with D at that Vin. */
export function buckRippleAmps(vin: number, vout: number, efficiency: number, henries: number, hz: number): number {
  const d = buckDuty(vout, vin, efficiency);
  return (Math.max(0, vin - vout) * d) / (henries * hz);
}

/**
 * Worst ripple over a range of output voltages at a fixed input. (Vin − Vo) × Vo peaks at Vo = Vin / 2,
 * so the largest value is at one end of the range or at that midpoint when it falls inside.
 */
export function worstBuckRippleAmps(
  vin: number,
  vout: { min: number; max: number },
  efficiency: number,
  henries: number,
  hz: number,
): number {
  const points = [vout.min, vout.max];
  if (vin / 2 > vout.min && vin / 2 < vout.max) points.push(vin / 2);
  return Math.max(...points.map((vo) => buckRippleAmps(vin, vo, efficiency, henries, hz)));
}

/** Ohm's law across a series resistor: I = (V − Vstring) / R, zero when the string is not lit. */
export function resistorAmps(volts: number, stringVolts: number, ohms: number): number {
  const i = (volts - stringVolts) / ohms;
  return i > 0 ? i : 0;
}

/**
 * Input voltage of a constant-power load (a switching driver) fed through a wire of `ohms`:
 * V = Vs − R × P / V, the larger root of V² − Vs·V + R·P = 0, written to stay exact for tiny drops.
 * When 4·R·P > Vs² the wire cannot carry that power at all ("collapsed"); the input then sits at Vs / 2,
 * the most the wire can deliver.
 */
export function constantPowerInputVolts(
  sourceVolts: number,
  ohms: number,
  watts: number,
): { volts: number; collapsed: boolean } {
  if (!(ohms > 0) || !(watts > 0)) return { volts: sourceVolts, collapsed: false };
  const x = (4 * ohms * watts) / sourceVolts / sourceVolts;
  if (!(x <= 1)) return { volts: sourceVolts / 2, collapsed: true };
  const drop = (sourceVolts * x) / (2 * (1 + Math.sqrt(1 - x)));
  return { volts: sourceVolts - drop, collapsed: false };
}

/**
 * What a constant-power load (a switching driver) draws through a wire of `ohms` from `sourceVolts`:
 * the physical (smaller-current) root of I × (Vs − I × R) = P, and the voltage left at the load.
 * No real root ("collapsed"): the figures are those at the most the wire can deliver, I = Vs / 2R.
 */
export function constantPowerDraw(
  sourceVolts: number,
  ohms: number,
  watts: number,
): { amps: number; volts: number; collapsed: boolean } {
  const { volts, collapsed } = constantPowerInputVolts(sourceVolts, ohms, watts);
  if (collapsed) return { amps: sourceVolts / (2 * ohms), volts, collapsed };
  // 0 / 0 only when both the power and the voltage underflow to zero: then nothing flows.
  const amps = volts > 0 ? watts / volts : 0;
  return { amps, volts, collapsed };
}
