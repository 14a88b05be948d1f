import { describe, expect, it } from 'vitest';
import { checkKit } from '@/lib/electrical';
import { checkOf, linearSpec, resistorSpec } from './fixtures';

describe('linear driver', () => {
  // 4 LEDs → 11.2 / 12.0 / 12.8 V; 350 mA; dropout 1.0 V; rated 30 V in.
  it.each([
    [13.8, 'ok'],
    [13.79, 'caution'],
    [13.0, 'caution'],
    [12.99, 'fail'],
  ] as const)('headroom with dropout: %f V → %s', (volts, verdict) => {
    expect(checkOf(checkKit(linearSpec({ supply: { volts } })), 'headroom').verdict).toBe(verdict);
  });

  it('input rating: 30 V ok, 30.01 V fails', () => {
    expect(checkOf(checkKit(linearSpec({ supply: { volts: 30 } })), 'supply-vs-driver-max').verdict).toBe('ok');
    expect(checkOf(checkKit(linearSpec({ supply: { volts: 30.01 } })), 'supply-vs-driver-max').verdict).toBe('fail');
  });

  it('loss (V_high − Vstring_min) × I and efficiency Vstring / V', () => {
    // Series pass element: it drops the difference at the full current (Horowitz & Hill, The Art of
    // Electronics, ch. 9, linear regulators; from memory). 24 V: (24 − 11.2) × 0.35 = 4.48 W; η = 12 / 24.
    const r = checkKit(linearSpec());
    expect(r.figures.lossWatts).toBeCloseTo(4.48, 12);
    expect(r.figures.efficiency).toBeCloseTo(0.5, 12);
    expect(r.figures.outputWatts).toBeCloseTo(4.2, 12);
    expect(r.figures.inputWatts).toBeCloseTo(8.4, 12);
    expect(r.figures.supplyAmps).toBeCloseTo(0.35, 12);
    // tolerance raises the worst-case loss: (25.2 − 11.2) × 0.35 = 4.9 W
    expect(checkKit(linearSpec({ supply: { tolerancePct: 5 } })).figures.lossWatts).toBeCloseTo(4.9, 12);
  });

  it.each([
    // rated 2 W: caution above 1.4 W (70 %, common practice (no source)) i.e. above 15.2 V; fail above 2 W i.e. 16.914 V
    [15.19, 'ok'],
    [15.21, 'caution'],
    [16.91, 'caution'],
    [16.92, 'fail'],
  ] as const)('heat with a 2 W rating at %f V → %s', (volts, verdict) => {
    expect(checkOf(checkKit(linearSpec({ supply: { volts }, driver: { maxWatts: 2 } })), 'regulator-heat').verdict).toBe(verdict);
  });

  it.each([
    // no rating: heat-sink above about 1 W (common practice (no source)): 1 W / 0.35 A + 11.2 V = 14.057 V
    [14.05, 'ok'],
    [14.06, 'caution'],
  ] as const)('heat without a rating at %f V → %s', (volts, verdict) => {
    expect(checkOf(checkKit(linearSpec({ supply: { volts } })), 'regulator-heat').verdict).toBe(verdict);
  });
});

describe('series resistor', () => {
  // 3 LEDs → 8.4 / 9.0 / 9.6 V through 100 Ω.
  it('current at each corner: (V − N × Vf) / R', () => {
    // Ohm's law and KVL (Horowitz & Hill ch. 1). 12 V ±5 %: high 12.6 V with vfMin → (12.6 − 8.4) / 100 = 42 mA.
    const r = checkKit(resistorSpec({ supply: { tolerancePct: 5 } }));
    expect(r.figures.resistorAmpsMax).toBeCloseTo(0.042, 12);
    expect(r.figures.ledAmpsPeak).toBeCloseTo(0.03, 12); // nominal, typical: (12 − 9) / 100
    expect(checkOf(r, 'led-current').value).toBeCloseTo(0.042, 12);
    // low corner: (11.4 − 9.6) / 100 = 18 mA, 60 % of the typical 30 mA
    expect(checkOf(r, 'resistor-spread').value).toBeCloseTo(0.018, 12);
    expect(checkOf(r, 'resistor-spread').verdict).toBe('ok');
  });

  it('figures: efficiency N·Vf / V, power at the nominal point, heat at the worst corner', () => {
    const r = checkKit(resistorSpec());
    expect(r.figures.efficiency).toBeCloseTo(0.75, 12);
    expect(r.figures.outputWatts).toBeCloseTo(0.27, 12);
    expect(r.figures.inputWatts).toBeCloseTo(0.36, 12);
    expect(r.figures.supplyAmps).toBeCloseTo(0.03, 12);
    // P = I² R (Joule), worst corner 36 mA: 0.1296 W
    expect(r.figures.lossWatts).toBeCloseTo(0.1296, 12);
  });

  it.each([
    // (3 × 3.2 is 9.600000000000001 in floating point, so the ok case sits a hair above)
    [9.61, 'ok'],
    [9.59, 'caution'],
    [9.0, 'caution'],
    [8.99, 'fail'],
  ] as const)('headroom: %f V → %s', (volts, verdict) => {
    expect(checkOf(checkKit(resistorSpec({ supply: { volts } })), 'headroom').verdict).toBe(verdict);
  });

  it.each([
    // worst-case heat 0.1296 W; caution above half the rating (common practice (no source)), fail above it
    [0.26, 'ok'],
    [0.25, 'caution'],
    [0.13, 'caution'],
    [0.129, 'fail'],
  ] as const)('resistor rated %f W → %s', (watts, verdict) => {
    const c = checkOf(checkKit(resistorSpec({ driver: { watts } })), 'resistor-power');
    expect(c.verdict).toBe(verdict);
    if (verdict !== 'ok') expect(c.message).toContain('rated 0.50 W or more'); // 2 × 0.1296 → next stock 0.5 W
  });

  it('LED current at the worst corner: just over fails, just under is ok', () => {
    // 36 mA at the high corner (tolerance 0)
    expect(checkOf(checkKit(resistorSpec({ led: { maxAmps: 0.0361 } })), 'led-current').verdict).toBe('ok');
    const c = checkOf(checkKit(resistorSpec({ led: { maxAmps: 0.0359 } })), 'led-current');
    expect(c.verdict).toBe('fail');
    // needs (12 − 8.4) / 0.0359 = 100.28 Ω → next E24 value 110 Ω
    expect(c.message).toContain('at least 110 Ω');
  });

  it('current spread: caution when the low corner falls under half the typical current', () => {
    // 10 V: typ (10 − 9) / 100 = 10 mA, low (10 − 9.6) / 100 = 4 mA < 5 mA → caution; 10.5 V: 15 vs 9 mA → ok
    expect(checkOf(checkKit(resistorSpec({ supply: { volts: 10 } })), 'resistor-spread').verdict).toBe('caution');
    expect(checkOf(checkKit(resistorSpec({ supply: { volts: 10.5 } })), 'resistor-spread').verdict).toBe('ok');
  });

  it('the wire run adds to the loop resistance', () => {
    const plain = checkKit(resistorSpec());
    const wired = checkKit(resistorSpec({ wiring: { lengthMeters: 50, awg: 30 } }));
    // 100 m of 30 AWG ≈ 33.9 Ω: (12 − 8.4) / 133.9 ≈ 26.9 mA at the high corner
    expect(wired.figures.resistorAmpsMax!).toBeLessThan(plain.figures.resistorAmpsMax!);
    expect(wired.figures.resistorAmpsMax!).toBeCloseTo(3.6 / (100 + 100 * 0.3385), 3);
  });
});
