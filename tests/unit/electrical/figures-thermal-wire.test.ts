import { describe, expect, it } from 'vitest';
import { checkKit, loopOhms } from '@/lib/electrical';
import { checkOf, linearSpec, resistorSpec } from './fixtures';

// The thermal and wire figures each report carries, worked by hand from the rules in
// lib/electrical/README.md. LED junction (rule 7): P_h = P_led; board 2 °C/W per LED and the 8 °C/W
// junction-to-solder-point default are from memory; a bare star in still air ≈ 40 °C/W (from memory).
// With n sinks of c °C/W: T_sink = T_a + (N × P_h / n) × c. The largest sink that keeps the junction 25 °C
// under its maximum (common practice (no source) for the margin): c = (T_max − 25 − T_a − P_h × 10) × n / (N × P_h).

describe('linear driver: thermal figures', () => {
  // 4 LEDs at vfMax 3.2 V × 350 mA = 1.12 W each (rule 4, worst case).
  it('without a heat sink: no sink temperature, and the sink needed is for one sink per LED', () => {
    const r = checkKit(linearSpec());
    expect(r.figures.ledWatts).toBeCloseTo(1.12, 9);
    expect(r.figures.ledJunctionC).toBeCloseTo(25 + 1.12 * (8 + 2 + 40), 9); // 81 °C
    expect(r.figures.sinkC).toBeUndefined();
    expect(r.figures.sinkCPerWNeeded!).toBeCloseTo((125 - 25 - 25 - 1.12 * 10) / 1.12, 6); // 56.96 °C/W
  });

  it('with two 5 °C/W sinks shared by the four LEDs', () => {
    const r = checkKit({ ...linearSpec(), heatSink: { count: 2, cPerW: 5 } });
    expect(r.figures.sinkC!).toBeCloseTo(25 + ((4 * 1.12) / 2) * 5, 9); // 36.2 °C
    expect(r.figures.ledJunctionC).toBeCloseTo(36.2 + 1.12 * 10, 9); // 47.4 °C
    expect(r.figures.sinkCPerWNeeded!).toBeCloseTo(((125 - 25 - 25 - 11.2) * 2) / (4 * 1.12), 6); // 28.48 °C/W
  });
});

describe('series resistor: thermal and wire figures', () => {
  // 3 LEDs, 100 Ω, 12 V: the LED power is largest at vfMin: 2.8 × (12 − 8.4) / 100 = 0.1008 W (rule 4).
  it('without a heat sink', () => {
    const r = checkKit(resistorSpec());
    expect(r.figures.ledWatts).toBeCloseTo(0.1008, 9);
    expect(r.figures.sinkC).toBeUndefined();
    expect(r.figures.sinkCPerWNeeded!).toBeCloseTo((125 - 25 - 25 - 1.008) / 0.1008, 6);
    expect(r.figures.wireDropVolts).toBeUndefined();
  });

  it('with one 10 °C/W sink under all three LEDs', () => {
    const r = checkKit({ ...resistorSpec(), heatSink: { count: 1, cPerW: 10 } });
    expect(r.figures.sinkC!).toBeCloseTo(25 + 3 * 0.1008 * 10, 9);
    expect(r.figures.sinkCPerWNeeded!).toBeCloseTo((125 - 25 - 25 - 1.008) / (3 * 0.1008), 6);
  });

  it('a wire run: the drop is the worst-corner current through the loop (Ohm’s law; ASTM B258 area)', () => {
    const wiring = { lengthMeters: 3, awg: 24 };
    const r = checkKit(resistorSpec({ wiring }));
    const amps = (12 - 8.4) / 100;
    expect(r.figures.wireDropVolts!).toBeCloseTo(amps * loopOhms(3, 24), 12);
    expect(checkOf(r, 'wire-drop').value).toBeCloseTo(amps * loopOhms(3, 24), 12);
    expect(checkOf(r, 'wire-drop').verdict).toBe('ok');
  });

  it('typical LEDs stay dark: the typical-current value is the negative current, not zero', () => {
    // (8 − 9) / 100 = −10 mA at the nominal supply (rule 9).
    const r = checkKit(resistorSpec({ supply: { volts: 8 } }));
    expect(checkOf(r, 'typical-current').verdict).toBe('fail');
    expect(checkOf(r, 'typical-current').value).toBeCloseTo(-0.01, 12);
  });
});
