import { describe, expect, it } from 'vitest';
import { checkKit, generalCautions, safetyCautions } from '@/lib/electrical';
import { buckSpec, linearSpec, resistorSpec } from './fixtures';

const idsFor = (spec: Parameters<typeof checkKit>[0]) => safetyCautions(spec, checkKit(spec)).map((c) => c.id);

describe('safety cautions', () => {
  it('always name mains supplies, polarity and current limit, and local codes', () => {
    for (const spec of [buckSpec(), linearSpec(), resistorSpec()]) {
      expect(idsFor(spec)).toEqual(expect.arrayContaining(['mains', 'polarity', 'fixed-wiring']));
    }
    const text = safetyCautions(buckSpec(), checkKit(buckSpec()))
      .map((c) => c.text)
      .join(' ');
    expect(text).toMatch(/certified/);
    expect(text).toMatch(/never open/i);
    expect(text).toMatch(/licensed electrician/);
    expect(text).toMatch(/polarity/);
  });

  it('eye safety for LEDs rated from half a watt', () => {
    // common practice (no source): high-power LEDs from about 0.5 W can dazzle or harm at close range
    expect(idsFor(buckSpec({ led: { maxWatts: 0.5 } }))).toContain('eyes');
    expect(idsFor(resistorSpec({ led: { maxWatts: 0.1, maxAmps: 0.05 } }))).not.toContain('eyes');
  });

  it('a heat sink above about 1 W per LED, with the junction and the sink that keeps it cool', () => {
    // worst case vfMax 3.2 V: × 0.3125 A = 1.00 W: no; × 0.32 A = 1.024 W: yes (common practice (no source))
    expect(idsFor(buckSpec({ driver: { outputAmps: 0.3125 } }))).not.toContain('led-heat');
    const spec = buckSpec({ driver: { outputAmps: 0.32 } });
    const text = safetyCautions(spec, checkKit(spec)).find((c) => c.id === 'led-heat')?.text;
    expect(text).toContain('1.02 W');
    // bare star: 25 + 1.024 × (8 + 2 + 40) = 76.2 °C; a sink per LED of at most (100 − 25 − 1.024 × 10) / 1.024 = 63.2 °C/W
    expect(text).toContain('76 °C');
    expect(text).toContain('at most 63.2 °C/W per LED');
    expect(text).toMatch(/junction/);
  });

  it('a hot junction under 1 W still gets the heat caution', () => {
    // 0.9 W on an LED with 60 °C/W to its solder point: 25 + 0.9 × 102 = 116.8 °C > 100 °C
    const spec = buckSpec({ driver: { outputAmps: 0.28125 }, led: { thermalOhmsJs: 60 } });
    expect(idsFor(spec)).toContain('led-heat');
  });

  it('a linear driver’s heat caution gives its junction temperature', () => {
    const spec = linearSpec({ driver: { sinkCPerW: 5 } });
    // 25 + 4.48 × (5 + 0.5 + 5) = 72.0 °C
    expect(safetyCautions(spec, checkKit(spec)).find((c) => c.id === 'driver-heat')?.text).toContain('72 °C');
  });

  it('above 60 V the build is outside the low-voltage scope', () => {
    expect(idsFor(buckSpec({ supply: { volts: 60 } }))).not.toContain('low-voltage');
    expect(idsFor(buckSpec({ supply: { volts: 61 } }))).toContain('low-voltage');
  });

  it('PWM pulses above the supply rating are pointed out', () => {
    // average 0.29630 A at 50 %, pulses 0.59259 A (worst-case buck draw)
    expect(idsFor(buckSpec({ supply: { maxAmps: 0.6 }, driver: { outputAmps: 1 }, led: { maxAmps: 2, maxWatts: 10 }, pwmDuty: 0.5 }))).not.toContain('pwm-peak');
    expect(idsFor(buckSpec({ supply: { maxAmps: 0.59 }, driver: { outputAmps: 1 }, led: { maxAmps: 2, maxWatts: 10 }, pwmDuty: 0.5 }))).toContain('pwm-peak');
  });

  it('driver or resistor heat above about 1 W', () => {
    expect(idsFor(linearSpec())).toContain('driver-heat'); // 4.48 W
    expect(idsFor(resistorSpec())).not.toContain('driver-heat'); // 0.13 W
  });

  it('a failed build says not to power it', () => {
    expect(idsFor(buckSpec({ supply: { volts: 48 } }))[0]).toBe('failed');
    expect(idsFor(buckSpec())).not.toContain('failed');
  });
});

describe('the edges of each caution', () => {
  const textOf = (spec: Parameters<typeof checkKit>[0], id: string) => safetyCautions(spec, checkKit(spec)).find((c) => c.id === id)?.text;

  it('eyes also when the worst-case power reaches half a watt on a smaller rating', () => {
    // vfMax 3.2 V × 0.15625 A = 0.5 W (P = V × I); × 0.15 A = 0.48 W. common practice (no source) for the 0.5 W line.
    expect(idsFor(buckSpec({ led: { maxWatts: 0.4 }, driver: { outputAmps: 0.15625 } }))).toContain('eyes');
    expect(idsFor(buckSpec({ led: { maxWatts: 0.4 }, driver: { outputAmps: 0.15 } }))).not.toContain('eyes');
    // and by the rating alone: a 0.5 W LED run at 0.1 A (3.2 V × 0.1 A = 0.32 W) still gets it
    expect(idsFor(buckSpec({ led: { maxWatts: 0.5 }, driver: { outputAmps: 0.1 } }))).toContain('eyes');
  });

  it('the low-voltage scope for every kind of driver', () => {
    // 61 V at 0 % tolerance is over the 60 V limit of SELV DC (IEC 61140, from memory); 60 V is not
    for (const make of [buckSpec, linearSpec, resistorSpec]) {
      expect(idsFor(make({ supply: { volts: 61 } }))).toContain('low-voltage');
      expect(idsFor(make({ supply: { volts: 60 } }))).not.toContain('low-voltage');
    }
  });

  it('a hot junction is judged against the LED’s own limit, 125 °C when it gives none', () => {
    // 0.9 W with 60 °C/W to the solder point, bare star: 25 + 0.9 × (60 + 2 + 40) = 116.8 °C (the check's LED
    // junction rule). Over 125 − 25 = 100 °C and 140 − 25 = 115 °C; under 150 − 25 = 125 °C.
    const at = (maxJunctionC?: number) =>
      idsFor(buckSpec({ driver: { outputAmps: 0.28125 }, led: { thermalOhmsJs: 60, ...(maxJunctionC ? { maxJunctionC } : {}) } }));
    expect(at()).toContain('led-heat');
    expect(at(140)).toContain('led-heat');
    expect(at(150)).not.toContain('led-heat');
  });

  it('with the kit’s heat sinks, the sink is given per sink; when no sink can do it, the current must come down', () => {
    // 4 LEDs at 3.2 V × 0.32 A = 1.024 W on four 10 °C/W sinks: T_sink = 25 + 1.024 × 10 = 35.2 °C,
    // T_j = 35.24 + 1.024 × (8 + 2) = 45.48 °C; the largest sink that keeps 100 °C is (100 − 25 − 10.24) / 1.024
    // = 63.2 °C/W (the check's LED junction rule; 8 °C/W and 2 °C/W board are from memory).
    const sunk = { ...buckSpec({ driver: { outputAmps: 0.32 } }), heatSink: { count: 4, cPerW: 10 } };
    expect(textOf(sunk, 'led-heat')).toContain('Their junctions reach about 45 °C; a sink of at most 63.2 °C/W each keeps them');
    // 3.2 V × 2.5 A = 8 W: 8 × 10 °C/W is already 80 °C over the air inside the LED, more than the 75 °C allowed.
    const hot = buckSpec({ driver: { outputAmps: 2.5 }, led: { maxAmps: 3, maxWatts: 10 } });
    expect(textOf(hot, 'led-heat')).toMatch(/no heat sink brings them 25 °C under their limit: lower the current/);
  });

  it('driver heat names the series resistor or the driver, and a junction only where the check gives one', () => {
    // 3 LEDs, 12 V, 10 Ω: (12 − 8.4) / 10 = 0.36 A, 0.36² × 10 = 1.30 W (Joule)
    expect(textOf(resistorSpec({ driver: { ohms: 10, watts: 5 } }), 'driver-heat')).toMatch(/^The series resistor turns up to 1\.30 W into heat\. Give it/);
    // buck: 12.8 V × 1 A = 12.8 W out, 12.8 / 0.9 − 12.8 = 1.42 W lost (energy balance, TI SLVA477)
    expect(textOf(buckSpec({ driver: { outputAmps: 1 } }), 'driver-heat')).toMatch(/^The driver turns up to 1\.42 W into heat\. Give it/);
  });

  it('no PWM caution at 100 % duty, even when the supply is over its rating', () => {
    const spec = buckSpec({ supply: { maxAmps: 0.3 }, driver: { outputAmps: 1 }, led: { maxAmps: 2, maxWatts: 10 }, pwmDuty: 1 });
    expect(checkKit(spec).checks.find((c) => c.id === 'supply-current')?.verdict).toBe('fail');
    expect(idsFor(spec)).not.toContain('pwm-peak');
  });
});

describe('general cautions', () => {
  it('are the ones every report carries', () => {
    const ids = generalCautions().map((c) => c.id);
    expect(ids).toEqual(['mains', 'polarity', 'fixed-wiring']);
    expect(idsFor(resistorSpec()).slice(-3)).toEqual(ids);
  });
});
