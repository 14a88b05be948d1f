import { describe, expect, it } from 'vitest';
import { keySpec, parseSpecs } from '@/lib/inventory/specs';

// Field naming is our own API contract (errors keyed `specs.<field>`); the spec fields themselves
// mirror the compatibility check's KitSpec (lib/electrical).

describe('parseSpecs', () => {
  it('names each missing buck-driver field with its specs. path', () => {
    const r = parseSpecs('driver', { type: 'buck', minInputVolts: 6 });
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(Object.keys(r.fields).sort()).toEqual(['specs.maxInputVolts', 'specs.outputAmps']);
  });

  it('refuses an input range whose maximum is not above its minimum, on maxInputVolts', () => {
    const r = parseSpecs('driver', { type: 'buck', minInputVolts: 36, maxInputVolts: 6, outputAmps: 0.35 });
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.fields['specs.maxInputVolts']?.[0]).toMatch(/above the minimum/);
  });

  it('refuses forward voltages out of order (min ≤ typ ≤ max)', () => {
    const r = parseSpecs('led', { vfMin: 3.4, vfTyp: 3.1, vfMax: 3.6, maxAmps: 0.7, maxWatts: 3 });
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.fields).toHaveProperty(['specs.vfTyp']);
  });

  it('treats blank form values as not given, and coerces typed numbers', () => {
    const r = parseSpecs('driver', {
      type: 'buck',
      minInputVolts: '6',
      maxInputVolts: '36',
      outputAmps: '0.35',
      switchingHz: '',
    });
    expect(r).toEqual({
      ok: true,
      specs: { type: 'buck', minInputVolts: 6, maxInputVolts: 36, outputAmps: 0.35 },
    });
  });

  it('gives a supply its default 5 % tolerance and refuses a negative current', () => {
    expect(parseSpecs('supply', { volts: 24, maxAmps: 2 })).toEqual({
      ok: true,
      specs: { volts: 24, maxAmps: 2, tolerancePct: 5, mains: true },
    });
    const bad = parseSpecs('supply', { volts: 24, maxAmps: -1 });
    expect(bad.ok).toBe(false);
    if (!bad.ok) expect(Object.keys(bad.fields)).toEqual(['specs.maxAmps']);
  });

  it('refuses a wire gauge that is not a whole number', () => {
    const r = parseSpecs('wire', { awg: 22.5 });
    expect(r.ok).toBe(false);
    if (!r.ok) expect(Object.keys(r.fields)).toEqual(['specs.awg']);
  });
});

describe('keySpec', () => {
  it('writes a driver as set current and input range', () => {
    expect(keySpec('driver', { type: 'buck', minInputVolts: 6, maxInputVolts: 36, outputAmps: 0.35 })).toBe(
      '350 mA · 6–36 V in',
    );
  });

  it('writes a linear driver, which states only a ceiling, as "up to"', () => {
    expect(
      keySpec('driver', { type: 'linear', maxInputVolts: 30, outputAmps: 0.35, dropoutVolts: 1.2 }),
    ).toBe('350 mA · up to 30 V in');
  });
});
