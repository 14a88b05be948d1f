// What each check tells the member, branch by branch: the numbers in the words are the check's own, and the
// advice names a concrete fix. (The numbers' sources are in the rule tests; here the words are pinned.)
import { describe, expect, it } from 'vitest';
import { type KitSpec, checkKit, evaluateKit, kitSpecSchema } from '@/lib/electrical';
import { buckSpec, checkOf, linearSpec, resistorSpec } from './fixtures';

const msg = (spec: KitSpec, id: Parameters<typeof checkOf>[1]) => checkOf(checkKit(spec), id).message;

describe('messages', () => {
  it('are left empty when the caller asks for no words (the ranking), and the verdicts do not change', () => {
    const spec = kitSpecSchema.parse(buckSpec({ supply: { volts: 14.5 } }));
    const quiet = evaluateKit(spec, { messages: false });
    const loud = evaluateKit(spec);
    expect(quiet.checks.every((c) => c.message === '')).toBe(true);
    expect(loud.checks.every((c) => c.message.length > 20)).toBe(true);
    expect(quiet.checks.map((c) => c.verdict)).toEqual(loud.checks.map((c) => c.verdict));
  });

  it('low-voltage limit: ok names the limit and the high end', () => {
    expect(msg(buckSpec(), 'low-voltage-limit')).toBe(
      'The supply stays at or under 60.0 V DC (its high end is 24.0 V): safety extra-low voltage.',
    );
  });

  it('supply against the driver input, ok', () => {
    expect(msg(buckSpec(), 'supply-vs-driver-max')).toBe("The supply's high end (24.0 V) is within the driver's 36.0 V input rating.");
    expect(msg(buckSpec(), 'supply-vs-driver-min')).toBe(
      "The supply's low end at the driver (24.0 V) reaches the driver's 6.0 V minimum input.",
    );
  });

  it('headroom: ok, caution and fail, with the parts of the need and a count of LEDs that fit', () => {
    expect(msg(buckSpec(), 'headroom')).toBe(
      "The supply's low end gives 24.0 V; worst-case LEDs need 14.3 V (string 12.8 V + 1.5 V headroom).",
    );
    expect(msg(buckSpec({ supply: { volts: 14 } }), 'headroom')).toBe(
      "Typical LEDs work, but worst-case ones need 14.3 V (string 12.8 V + 1.5 V headroom) and the supply's low end gives 14.0 V, so the current may sag. Use a supply of at least 14.3 V, or drive at most 3 LEDs from this one.",
    );
    expect(msg(linearSpec({ supply: { volts: 12 } }), 'headroom')).toBe(
      "The supply's low end gives 12.0 V, short of the 13.0 V even typical LEDs need (string 12.0 V + 1.0 V dropout). Use a supply of at least 13.8 V, or drive at most 3 LEDs from this one.",
    );
    // one LED fits: singular
    expect(msg(buckSpec({ supply: { volts: 6 } }), 'headroom')).toContain('drive at most 1 LED from this one');
    // no LED fits: no count
    expect(msg(buckSpec({ supply: { volts: 4 }, driver: { minInputVolts: 1 } }), 'headroom')).not.toContain('drive at most');
  });

  it('headroom through a wire says "at the driver" and asks for more to cover the drop', () => {
    const m = msg(buckSpec({ supply: { volts: 14.3 }, wiring: { lengthMeters: 1, awg: 24 } }), 'headroom');
    expect(m).toMatch(/^Typical LEDs work, .* gives 14\.2 V at the driver/);
    expect(m).toContain('Use a supply of at least 14.4 V');
  });

  it('duty: ok, caution, fail', () => {
    expect(msg(buckSpec(), 'duty')).toBe("Worst-case duty is 59.3 %, within the driver's 95.0 % limit.");
    expect(msg(buckSpec({ supply: { volts: 14.5 } }), 'duty')).toBe(
      "Typical LEDs need a duty of 92.0 %, but worst-case ones need 98.1 % at the supply's low end, above the driver's 95.0 % limit, so the current may sag. A supply of at least 15.0 V clears it.",
    );
    expect(msg(buckSpec({ supply: { volts: 14 } }), 'duty')).toBe(
      "Even typical LEDs need a duty of 95.2 %, above the driver's 95.0 % limit. Use a supply of at least 15.0 V, or fewer LEDs.",
    );
  });

  it('driver output range: ok, and a fail that counts the LEDs that fit', () => {
    expect(msg(buckSpec({ driver: { maxOutputVolts: 30 } }), 'driver-max-output')).toBe(
      "The string needs at most 12.8 V, within the driver's 30.0 V output range.",
    );
    expect(msg(buckSpec({ driver: { maxOutputVolts: 12 } }), 'driver-max-output')).toBe(
      "Worst-case LEDs need up to 12.8 V, beyond the driver's 12.0 V output limit. Use at most 3 LEDs per string, or a driver that can give at least 12.8 V out.",
    );
    expect(msg(buckSpec({ driver: { maxOutputVolts: 3 } }), 'driver-max-output')).toContain('output limit. Use a driver that can give');
  });

  it('ripple: ok and caution with the inductor that would do', () => {
    expect(msg(buckSpec({ driver: { inductorHenries: 470e-6, switchingHz: 300e3 } }), 'ripple')).toBe(
      'Inductor ripple is at most 47 mA peak to peak (13.5 % of the output current), within 40 % (140 mA).',
    );
    const m = msg(buckSpec({ driver: { inductorHenries: 100e-6, switchingHz: 100e3 } }), 'ripple');
    expect(m).toMatch(/^Inductor ripple reaches 667 mA peak to peak, 190\.5 % of the output current \(over 140 mA, 40 %\)/);
    // L × ΔI / limit = 100 µH × 0.6667 / 0.14 = 476 µH
    expect(m).toContain('An inductor of at least 476 µH');
  });

  it('LED current: the set current, or the peak with ripple', () => {
    expect(msg(buckSpec(), 'led-current')).toBe("The driver sets 0.350 A at most, within the LED's 1.000 A rating.");
    expect(msg(buckSpec({ driver: { inductorHenries: 470e-6, switchingHz: 300e3 } }), 'led-current')).toMatch(/^With ripple the LEDs see 0\.374 A at most/);
    expect(msg(buckSpec({ driver: { outputAmps: 1.2 } }), 'led-current')).toBe(
      "The driver sets 1.200 A, above the LED's 1.000 A rating; PWM dimming does not lower this peak. Choose a driver of at most 1.000 A.",
    );
  });

  it('inductor saturation: ok and fail', () => {
    expect(msg(buckSpec({ driver: { inductorSatAmps: 1 } }), 'inductor-saturation')).toBe(
      "The inductor's peak current (0.350 A) is within its 1.000 A saturation rating.",
    );
  });

  it('LED power: ok, caution and fail', () => {
    expect(msg(buckSpec(), 'led-power')).toBe('Each LED takes at most 1.12 W of its 3.00 W rating.');
    expect(msg(buckSpec({ driver: { outputAmps: 0.8 } }), 'led-power')).toBe(
      'Each LED takes up to 2.56 W, over 70 % of its 3.00 W rating (2.10 W): mount the LEDs on a heat sink.',
    );
    expect(msg(buckSpec({ driver: { outputAmps: 1 } }), 'led-power')).toBe(
      'Each LED would take up to 3.20 W with worst-case forward voltage, above its 3.00 W rating. Lower the average current to at most 938 mA.',
    );
  });

  it('supply current: ok, caution and fail, with the rating that leaves room', () => {
    expect(msg(buckSpec(), 'supply-current')).toBe("The build draws at most 0.207 A of the supply's 10.000 A.");
    // 0.2074 A against 0.25 A: over 80 % (0.2 A)
    expect(msg(buckSpec({ supply: { maxAmps: 0.25 } }), 'supply-current')).toBe(
      "The build draws up to 207 mA, over 80 % of the supply's 250 mA, leaving little reserve. A supply rated 300 mA or more leaves room.",
    );
    expect(msg(buckSpec({ supply: { maxAmps: 0.2 } }), 'supply-current')).toBe(
      "At worst the build needs 207 mA, more than the supply's 200 mA. Use a supply rated for at least 300 mA.",
    );
  });

  it('wire drop: a small drop, a large one with a gauge, and a run that cannot carry the power', () => {
    expect(msg(linearSpec({ wiring: { lengthMeters: 1, awg: 18 } }), 'wire-drop')).toBe(
      'The 1 m run of 18 AWG drops 0.0 V out and back (0.1 % of the supply).',
    );
    expect(msg(linearSpec({ wiring: { lengthMeters: 50, awg: 30 } }), 'wire-drop')).toMatch(
      /^The 50 m run of 30 AWG drops 11\.8 V out and back \(49\.4 % of the supply\)\. Over 5 % is wasted as heat in the wire: Use 20 AWG or thicker, or a shorter run\.$/,
    );
    expect(msg(buckSpec({ driver: { outputAmps: 1 }, led: { maxAmps: 2, maxWatts: 10 }, wiring: { lengthMeters: 15, awg: 30 } }), 'wire-drop')).toMatch(
      /^The 15 m run of 30 AWG has too much resistance \(10\.2 Ω out and back\) to carry the driver's power at all\. Use \d+ AWG or thicker/,
    );
    expect(msg(linearSpec({ wiring: { lengthMeters: 1000, awg: -3 }, driver: { outputAmps: 0.35 } }), 'wire-drop')).not.toContain('No common wire');
  });

  it('wire current density: ok, caution and fail, with the gauge that carries it', () => {
    expect(msg(linearSpec({ wiring: { lengthMeters: 1, awg: 24 } }), 'wire-current-density')).toBe(
      '350 mA in 24 AWG (0.205 mm²) is 1.7 A/mm², a comfortable density.',
    );
    expect(msg(linearSpec({ wiring: { lengthMeters: 1, awg: 30 } }), 'wire-current-density')).toBe(
      '350 mA in 30 AWG (0.0509 mm²) is 6.9 A/mm², over 4.0 A/mm²: the wire will run warm, more so in a bundle. Use 27 AWG or thicker.',
    );
    expect(msg(linearSpec({ wiring: { lengthMeters: 0.1, awg: 36 } }), 'wire-current-density')).toBe(
      '350 mA in 36 AWG (0.0127 mm²) is 27.6 A/mm², over 10.0 A/mm²: the wire overheats. Use 27 AWG or thicker.',
    );
  });

  it('LED junction: ok on bare stars, caution and fail with the sink that would do', () => {
    expect(msg(buckSpec(), 'led-junction')).toBe(
      'The LED junctions reach about 81 °C on bare star boards in still air, at least 25 °C under their 125 °C maximum (100 °C).',
    );
    expect(msg(buckSpec({ driver: { outputAmps: 0.5 } }), 'led-junction')).toBe(
      'The LED junctions reach about 105 °C on bare star boards in still air, within 25 °C of their 125 °C maximum (over 100 °C): heat shortens their life. Mount each LED on a heat sink of at most 36.8 °C/W (or share a larger one) to keep the junction at or under 100 °C.',
    );
    const one = { ...buckSpec({ driver: { outputAmps: 0.5 } }), heatSink: { count: 1, cPerW: 15 } };
    expect(msg(one, 'led-junction')).toMatch(/on the kit’s heat sink \(sink at 121 °C\), above their 125 °C maximum: they will fail early or at once\. A sink of at most 9\.2 °C\/W each keeps/);
    const two = { ...buckSpec({ driver: { outputAmps: 0.5 } }), heatSink: { count: 2, cPerW: 5 } };
    expect(msg(two, 'led-junction')).toContain('on the kit’s 2 heat sinks (sink at 41 °C)');
  });

  it('regulator: rated heat ok and fail with a supply range, junction on a sink', () => {
    expect(msg(linearSpec({ driver: { maxWatts: 10, sinkCPerW: 1 } }), 'regulator-heat')).toBe(
      'The driver turns at most 4.48 W into heat, within its 10.00 W rating.',
    );
    expect(msg(linearSpec({ driver: { maxWatts: 3, sinkCPerW: 1 } }), 'regulator-heat')).toBe(
      'The driver would turn up to 4.48 W into heat, above its 3.00 W rating. A supply between 13.8 V and 19.7 V wastes less, or use a buck driver.',
    );
    expect(msg(linearSpec({ driver: { maxWatts: 0.1, sinkCPerW: 1 } }), 'regulator-heat')).toContain('A buck driver wastes far less.');
    expect(msg(linearSpec({ driver: { sinkCPerW: 1 } }), 'regulator-junction')).toBe(
      'The driver loses at most 4.48 W; its junction reaches about 54 °C on its heat sink, at least 25 °C under its 125 °C maximum (100 °C).',
    );
    expect(msg(linearSpec({ driver: { sinkCPerW: 12 } }), 'regulator-junction')).toMatch(
      /^The driver loses up to 4\.48 W; its junction reaches about 103 °C on its heat sink, within 25 °C of its 125 °C maximum \(over 100 °C\)\. A heat sink of at most 11\.2 °C\/W keeps it at or under 100 °C\./,
    );
  });

  it('resistor: typical current, LED current advice, power', () => {
    expect(msg(resistorSpec(), 'typical-current')).toBe('With typical LEDs the resistor passes 30 mA at the nominal 12.0 V.');
    expect(msg(resistorSpec({ supply: { volts: 8.9 } }), 'typical-current')).toBe(
      'The nominal supply (8.9 V) is not above the typical string voltage (9.0 V): typical LEDs stay dark or barely glow. Use a supply of at least 10.6 V, or fewer LEDs.',
    );
    expect(msg(resistorSpec(), 'led-current')).toBe(
      "At worst (supply high, low-Vf LEDs) the resistor lets 0.036 A at most, within the LED's 1.000 A rating.",
    );
    expect(msg(resistorSpec({ led: { maxAmps: 0.02 }, driver: { ohms: 0.01 } }), 'led-current')).toContain('Use at least 180 Ω');
    expect(msg(resistorSpec({ led: { maxAmps: 1e-9 } }), 'led-current')).toContain('Use a constant-current driver instead.');
    expect(msg(resistorSpec({ driver: { watts: 0.001 } }), 'resistor-power')).toBe(
      'The resistor would dissipate up to 0.130 W, above its 0.001 W rating. Use a resistor rated 0.50 W or more.',
    );
    expect(msg(resistorSpec({ driver: { ohms: 0.5, watts: 1 } }), 'resistor-power')).toContain('That is too much heat for a resistor');
  });

  it('a supply over the driver rating names the tolerance only when there is one', () => {
    expect(msg(buckSpec({ supply: { volts: 38 } }), 'supply-vs-driver-max')).toBe(
      "The supply can reach 38.0 V, above the driver's 36.0 V input rating. Choose a driver rated for at least 38.0 V in, or a supply of at most 36.0 V.",
    );
    expect(msg(buckSpec({ supply: { volts: 36, tolerancePct: 5 } }), 'supply-vs-driver-max')).toBe(
      "The supply can reach 37.8 V with its 5.0 % tolerance, above the driver's 36.0 V input rating. Choose a driver rated for at least 37.8 V in, or a supply of at most 34.2 V.",
    );
  });

  it('an LED over-current from ripple alone asks for less ripple or a smaller set current', () => {
    const spec: KitSpec = {
      supply: { volts: 24, tolerancePct: 0, maxAmps: 10 },
      driver: { type: 'buck', minInputVolts: 6, maxInputVolts: 36, outputAmps: 1, efficiency: 1, inductorHenries: 50e-6, switchingHz: 300e3 },
      string: { count: 4, led: { vfMin: 3, vfTyp: 3, vfMax: 3, maxAmps: 1.1, maxWatts: 20 } },
    };
    expect(msg(spec, 'led-current')).toBe(
      "With ripple the LEDs see 1.200 A, above the LED's 1.100 A rating; PWM dimming does not lower this peak. Lower the ripple (a larger inductor or a faster switching frequency) or choose a driver of at most 900 mA.",
    );
  });

  it('a regulator too hot in free air: the sink that would do, the supply range that would waste less', () => {
    expect(msg(linearSpec({ supply: { volts: 40 }, driver: { maxInputVolts: 50 } }), 'regulator-junction')).toBe(
      'The driver would lose up to 10.08 W; its junction would reach about 655 °C in free air (no heat sink given), above its 125 °C maximum, and it will shut down or fail. A heat sink of at most 1.9 °C/W keeps it at or under 100 °C. A supply between 13.8 V and 14.6 V wastes less, or use a buck driver.',
    );
    expect(msg(linearSpec({ supply: { volts: 60 }, driver: { maxInputVolts: 60, outputAmps: 3 }, led: { maxAmps: 5, maxWatts: 50 } }), 'regulator-junction')).toMatch(
      /No heat sink is enough at this loss\. A buck driver wastes far less\.$/,
    );
  });

  it('a resistor through a wire run: the resistance needed takes no credit for the wire', () => {
    // (12 − 8.4) / 0.02 = 180 Ω (Ohm's law; the shortest run is the worst case) → E24 180 Ω
    expect(msg(resistorSpec({ led: { maxAmps: 0.02 }, wiring: { lengthMeters: 10, awg: 30 } }), 'led-current')).toContain('Use at least 180 Ω');
    expect(msg(resistorSpec({ led: { maxAmps: 0.02 }, wiring: { lengthMeters: 10, awg: 30 } }), 'led-current')).toContain('resistor lets 36 mA');
  });

  it('a sink for many LEDs may need to be better than 0.1 °C/W', () => {
    // 200 LEDs of 3 W on one sink: (100 − 25 − 30) / 600 = 0.075 °C/W
    const spec: KitSpec = {
      supply: { volts: 24, maxAmps: 100 },
      driver: { type: 'linear', maxInputVolts: 30, outputAmps: 1, dropoutVolts: 1, sinkCPerW: 1 },
      string: { count: 200, led: { vfMin: 0.1, vfTyp: 0.1, vfMax: 3, maxAmps: 2, maxWatts: 10 } },
      heatSink: { count: 1, cPerW: 1 },
    };
    expect(msg(spec, 'led-junction')).toContain('A sink of at most 0.075 °C/W each');
  });

  it('a tiny supply rating is not printed as zero', () => {
    expect(msg(buckSpec({ supply: { volts: 20, maxAmps: 0.0001 } }), 'supply-current')).toContain("more than the supply's 0.1 mA");
  });
});
