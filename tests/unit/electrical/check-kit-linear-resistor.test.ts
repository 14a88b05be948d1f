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

  it('loss (V_high − S_min) × I_avg and efficiency S_typ / V', () => {
    // Series pass element: it drops the difference at the full current (Horowitz & Hill, The Art of
    // Electronics, ch. 9, linear regulators; from memory). 24 V: (24 − 11.2) × 0.35 = 4.48 W; η = 12 / 24.
    const r = checkKit(linearSpec());
    expect(r.figures.lossWatts).toBeCloseTo(4.48, 12);
    expect(r.figures.efficiency).toBeCloseTo(0.5, 12);
    // worst-case string power S_max × I_avg = 12.8 × 0.35
    expect(r.figures.outputWatts).toBeCloseTo(4.48, 12);
    expect(r.figures.inputWatts).toBeCloseTo(24 * 0.35, 12);
    expect(r.figures.supplyAmps).toBeCloseTo(0.35, 12);
    expect(r.figures.ledAmpsPeak).toBe(0.35);
    // tolerance raises the worst-case loss: (25.2 − 11.2) × 0.35 = 4.9 W
    expect(checkKit(linearSpec({ supply: { tolerancePct: 5 } })).figures.lossWatts).toBeCloseTo(4.9, 12);
    // PWM averages it: × 0.5
    expect(checkKit(linearSpec({ pwmDuty: 0.5 })).figures.lossWatts).toBeCloseTo(2.24, 12);
  });

  it.each([
    // rated 2 W: fail above 2 W, i.e. above (2 / 0.35) + 11.2 = 16.914 V; no caution band on the rating
    [16.91, 'ok'],
    [16.92, 'fail'],
  ] as const)('heat with a 2 W rating at %f V → %s', (volts, verdict) => {
    expect(checkOf(checkKit(linearSpec({ supply: { volts }, driver: { maxWatts: 2, sinkCPerW: 1 } })), 'regulator-heat').verdict).toBe(verdict);
  });

  it('without a power rating there is no rating check, only the junction', () => {
    const ids = checkKit(linearSpec()).checks.map((c) => c.id);
    expect(ids).not.toContain('regulator-heat');
    expect(ids).toContain('regulator-junction');
  });

  // One LED (2.8 / 3.0 / 3.2 V) at 0.4 A: loss = (V − 2.8) × 0.4. In free air T_j = 25 + loss × 62.5
  // (TO-220 class junction → ambient, from memory): 1.2 W → 100 °C exactly (the caution line, 125 − 25,
  // common practice (no source)); 1.6 W → 125 °C exactly (the default maximum junction, from memory).
  const freeAir = (volts: number) =>
    checkOf(checkKit(linearSpec({ supply: { volts }, count: 1, driver: { outputAmps: 0.4 } })), 'regulator-junction');
  it.each([
    [5.8, 'ok'],
    [5.81, 'caution'],
    [6.8, 'caution'],
    [6.81, 'fail'],
  ] as const)('regulator junction in free air at %f V → %s', (volts, verdict) => {
    const c = freeAir(volts);
    expect(c.verdict).toBe(verdict);
    expect(c.value).toBeCloseTo(25 + (volts - 2.8) * 0.4 * 62.5, 9);
    expect(c.limit).toBe(125);
    expect(c.unit).toBe('°C');
  });

  it.each([
    // loss 4.48 W through 5 °C/W (junction → case, default, from memory) + 0.5 °C/W interface (from memory)
    // + the sink: caution above 75 / 4.48 − 5.5 = 11.241 °C/W, fail above 100 / 4.48 − 5.5 = 16.821 °C/W
    [11.24, 'ok'],
    [11.25, 'caution'],
    [16.82, 'caution'],
    [16.83, 'fail'],
  ] as const)('regulator on a %f °C/W sink → %s', (sinkCPerW, verdict) => {
    const r = checkKit(linearSpec({ driver: { sinkCPerW } }));
    expect(checkOf(r, 'regulator-junction').verdict).toBe(verdict);
    expect(r.figures.regulatorJunctionC).toBeCloseTo(25 + 4.48 * (5 + 0.5 + sinkCPerW), 9);
  });

  it('uses the junction-to-case resistance, the maximum junction and the ambient given', () => {
    const r = checkKit({ ...linearSpec({ driver: { sinkCPerW: 4, junctionToCaseCPerW: 2, maxJunctionC: 150 } }), ambientC: 40 });
    expect(r.figures.regulatorJunctionC).toBeCloseTo(40 + 4.48 * 6.5, 9);
    expect(checkOf(r, 'regulator-junction').limit).toBe(150);
  });

  it('a hot regulator says which sink would do', () => {
    const c = freeAir(6.81);
    // room 100 − 25 = 75 °C over 1.604 W → 46.76 °C/W − 5.5 = 41.26 → "at most 41.2 °C/W"
    expect(c.message).toContain('at most 41.2 °C/W');
  });
});

describe('series resistor', () => {
  // 3 LEDs → 8.4 / 9.0 / 9.6 V through 100 Ω.
  it('current at the worst corner: (V_high − N × vfMin) / R', () => {
    // Ohm's law and KVL (Horowitz & Hill ch. 1). 12 V ±5 %: high 12.6 V with vfMin → (12.6 − 8.4) / 100 = 42 mA.
    const r = checkKit(resistorSpec({ supply: { tolerancePct: 5 } }));
    expect(r.figures.resistorAmpsMax).toBeCloseTo(0.042, 12);
    expect(r.figures.ledAmpsPeak).toBeCloseTo(0.042, 12);
    expect(checkOf(r, 'led-current').value).toBeCloseTo(0.042, 12);
    // typical: (12 − 9) / 100 = 30 mA at the nominal supply
    expect(checkOf(r, 'typical-current').value).toBeCloseTo(0.03, 12);
  });

  it('figures: worst-corner current, LED power the largest over the Vf spread, heat I_max² × R', () => {
    const r = checkKit(resistorSpec());
    expect(r.figures.efficiency).toBeCloseTo(0.75, 12);
    expect(r.figures.ledAmpsAvg).toBeCloseTo(0.036, 12);
    expect(r.figures.supplyAmps).toBeCloseTo(0.036, 12);
    // vf × (12 − 3 vf) / 100 at 2.8 / 3.0 / 3.2 V: 0.1008 / 0.09 / 0.0768 W → 0.1008 W
    expect(r.figures.ledWatts).toBeCloseTo(0.1008, 12);
    expect(r.figures.outputWatts).toBeCloseTo(3 * 0.1008, 12);
    expect(r.figures.inputWatts).toBeCloseTo(12 * 0.036, 12);
    // P = I² R (Joule), worst corner 36 mA: 0.1296 W
    expect(r.figures.lossWatts).toBeCloseTo(0.1296, 12);
  });

  it('the LED power corner can be the typical forward voltage', () => {
    // vf (V − N vf) / R peaks at vf = V / 2N = 2 V: 1.8 / 2.0 / 2.2 V give 0.1188 / 0.12 / 0.1188 W
    const r = checkKit(resistorSpec({ led: { vfMin: 1.8, vfTyp: 2.0, vfMax: 2.2 } }));
    expect(r.figures.ledWatts).toBeCloseTo(0.12, 12);
    // PWM averages it
    expect(checkKit(resistorSpec({ led: { vfMin: 1.8, vfTyp: 2.0, vfMax: 2.2 }, pwmDuty: 0.25 })).figures.ledWatts).toBeCloseTo(0.03, 12);
  });

  it.each([
    // (3 × 3.0 is exactly 9 V here): I_typ = (V − S_typ) / R must be above 0 (Ohm's law)
    [9.01, 'ok'],
    [9.0, 'fail'],
    [8.5, 'fail'],
  ] as const)('typical current: %f V → %s', (volts, verdict) => {
    expect(checkOf(checkKit(resistorSpec({ supply: { volts } })), 'typical-current').verdict).toBe(verdict);
  });

  it('has no headroom check (the typical current replaces it)', () => {
    expect(checkKit(resistorSpec()).checks.map((c) => c.id)).not.toContain('headroom');
  });

  it.each([
    // worst-case heat 0.1296 W; caution above half the rating (common practice (no source)), fail above it
    [0.26, 'ok'],
    [0.2592, 'ok'],
    [0.25, 'caution'],
    [0.13, 'caution'],
    [0.1296, 'caution'],
    [0.129, 'fail'],
  ] as const)('resistor rated %f W → %s', (watts, verdict) => {
    const c = checkOf(checkKit(resistorSpec({ driver: { watts } })), 'resistor-power');
    expect(c.verdict).toBe(verdict);
    if (verdict !== 'ok') expect(c.message).toContain('rated 0.50 W or more'); // 2 × 0.1296 → next stock 0.5 W
  });

  it('resistor heat is the peak I_max² × R, PWM or not', () => {
    expect(checkOf(checkKit(resistorSpec({ pwmDuty: 0.1 })), 'resistor-power').value).toBeCloseTo(0.1296, 12);
  });

  it('LED current at the worst corner: just over fails, just under is ok', () => {
    // 36 mA at the high corner (tolerance 0)
    expect(checkOf(checkKit(resistorSpec({ led: { maxAmps: 0.036 } })), 'led-current').verdict).toBe('ok');
    const c = checkOf(checkKit(resistorSpec({ led: { maxAmps: 0.0359 } })), 'led-current');
    expect(c.verdict).toBe('fail');
    // needs (12 − 8.4) / 0.0359 = 100.28 Ω → next E24 value 110 Ω
    expect(c.message).toContain('at least 110 Ω');
  });

  it('supply current is I_max × PWM duty', () => {
    expect(checkOf(checkKit(resistorSpec({ pwmDuty: 0.5 })), 'supply-current').value).toBeCloseTo(0.018, 12);
  });

  it('the wire run does not lower the worst-case current: the shortest run is the worst case', () => {
    // Rule 9 of lib/electrical/README.md: I_max = (V_high − S_min) / R with R the resistor alone
    // (Ohm's law; the wire's own resistance would only help, so the worst case leaves it out).
    const plain = checkKit(resistorSpec());
    const wired = checkKit(resistorSpec({ wiring: { lengthMeters: 50, awg: 30 } }));
    expect(wired.figures.resistorAmpsMax!).toBeCloseTo(plain.figures.resistorAmpsMax!, 12);
    expect(wired.figures.resistorAmpsMax!).toBeCloseTo(3.6 / 100, 9);
    // The drop it reports is that worst current through 100 m of 30 AWG (≈ 0.3385 Ω/m, ASTM B258 + IEC 60028).
    expect(wired.figures.wireDropVolts!).toBeCloseTo(0.036 * 100 * 0.3385, 2);
  });
});
