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

describe('general cautions', () => {
  it('are the ones every report carries', () => {
    const ids = generalCautions().map((c) => c.id);
    expect(ids).toEqual(['mains', 'polarity', 'fixed-wiring']);
    expect(idsFor(resistorSpec()).slice(-3)).toEqual(ids);
  });
});
