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

  it('a heat sink above about 1 W per LED', () => {
    // 3 V × 0.33 A = 0.99 W: no; 3 V × 0.34 A = 1.02 W: yes (common practice (no source))
    expect(idsFor(buckSpec({ driver: { outputAmps: 0.33 } }))).not.toContain('led-heat');
    const withHeat = safetyCautions(buckSpec({ driver: { outputAmps: 0.34 } }), checkKit(buckSpec({ driver: { outputAmps: 0.34 } })));
    expect(withHeat.find((c) => c.id === 'led-heat')?.text).toContain('1.02 W');
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
