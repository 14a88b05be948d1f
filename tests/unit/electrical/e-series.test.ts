import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { E12, E24, nearestAtOrAbove, nearestAtOrBelow, wattageAtOrAbove } from '@/lib/electrical';

describe('E-series (IEC 60063)', () => {
  it('E12 is the published list', () => {
    // IEC 60063, E12: 1.0 1.2 1.5 1.8 2.2 2.7 3.3 3.9 4.7 5.6 6.8 8.2
    expect([...E12]).toEqual([1.0, 1.2, 1.5, 1.8, 2.2, 2.7, 3.3, 3.9, 4.7, 5.6, 6.8, 8.2]);
  });

  it('E24 is the published list', () => {
    // IEC 60063, E24: 1.0 1.1 1.2 1.3 1.5 1.6 1.8 2.0 2.2 2.4 2.7 3.0 3.3 3.6 3.9 4.3 4.7 5.1 5.6 6.2 6.8 7.5 8.2 9.1
    expect([...E24]).toEqual([
      1.0, 1.1, 1.2, 1.3, 1.5, 1.6, 1.8, 2.0, 2.2, 2.4, 2.7, 3.0, 3.3, 3.6, 3.9, 4.3, 4.7, 5.1, 5.6, 6.2, 6.8, 7.5, 8.2, 9.1,
    ]);
  });

  it('E12 is every other E24 value', () => {
    // IEC 60063: each series En is a subset of E2n.
    expect(E24.filter((_, i) => i % 2 === 0)).toEqual([...E12]);
  });

  it.each([
    [4.7, E24, 4.7],
    [4.71, E24, 5.1],
    [4.71, E12, 5.6],
    [136.36, E24, 150],
    [107.1, E24, 110],
    [107.1, E12, 120],
    [9.2, E24, 10],
    [0.0471, E24, 0.051],
    [10, E24, 10],
    [99.9, E12, 100],
    [1000.0001, E24, 1100],
    [47_000, E12, 47_000],
  ] as const)('nearestAtOrAbove(%f) in its series is %f', (value, series, expected) => {
    expect(nearestAtOrAbove(value, series)).toBe(expected);
  });

  it.each([
    [136, E24, 130],
    [4.7, E12, 4.7],
    [9.99, E12, 8.2],
    [1, E24, 1],
    [0.99, E24, 0.91],
    [1.05, E24, 1],
    [8.19, E12, 6.8],
    [0.0472, E12, 0.047],
  ] as const)('nearestAtOrBelow(%f) is %f', (value, series, expected) => {
    expect(nearestAtOrBelow(value, series)).toBe(expected);
  });

  it('rejects values with no answer', () => {
    for (const f of [nearestAtOrAbove, nearestAtOrBelow])
      for (const v of [0, -5, Number.NaN, Infinity]) expect(() => f(v)).toThrow(RangeError);
  });

  it('exact powers of ten, where log10 lands a decade low, are members of the series', () => {
    // IEC 60063: every series holds 1.0 in each decade. log10(1000) is 2.9999999999999996 in binary.
    for (const p of [1000, 1e6, 0.001])
      for (const series of [E12, E24]) {
        expect(nearestAtOrAbove(p, series)).toBe(p);
        expect(nearestAtOrBelow(p, series)).toBe(p);
      }
    // and the values just beside them go to the neighbours (IEC 60063 E24: … 9.1, 10, 11 …)
    expect(nearestAtOrBelow(999.9)).toBe(910);
    expect(nearestAtOrAbove(1000.1)).toBe(1100);
    expect(nearestAtOrBelow(1099)).toBe(1000);
    // float dust on either side of a series value stays on it (4.7 × 10 = 47.00000000000001)
    expect(nearestAtOrBelow(4.7 * 10)).toBe(47);
    expect(nearestAtOrAbove(47 - 1e-14)).toBe(47);
  });

  it('always answers a member of the series at or below the value, with nothing of the series in between', () => {
    fc.assert(
      fc.property(fc.double({ min: 1e-3, max: 1e9, noNaN: true }), fc.constantFrom(E12, E24), (value, series) => {
        const r = nearestAtOrBelow(value, series);
        expect(r).toBeLessThanOrEqual(value * (1 + 1e-12));
        const decade = Math.pow(10, Math.floor(Math.log10(r) + 1e-12));
        expect(series).toContain(Number((r / decade).toPrecision(6)));
        expect(nearestAtOrAbove(r * (1 + 1e-9), series)).toBeGreaterThan(value * (1 - 1e-12));
      }),
    );
  });

  it('always answers a member of the series at or above the value, with nothing of the series in between', () => {
    fc.assert(
      fc.property(fc.double({ min: 1e-3, max: 1e9, noNaN: true }), fc.constantFrom(E12, E24), (value, series) => {
        const r = nearestAtOrAbove(value, series);
        expect(r).toBeGreaterThanOrEqual(value * (1 - 1e-12));
        const decade = Math.pow(10, Math.floor(Math.log10(r) + 1e-12));
        const mantissa = Number((r / decade).toPrecision(6));
        expect(series).toContain(mantissa);
        // the series value just below r (in the same or the previous decade) is below `value`
        const below = nearestAtOrBelow(r * (1 - 1e-9), series);
        expect(below).toBeLessThan(value * (1 + 1e-12));
      }),
    );
  });
});

describe('resistor wattage to buy', () => {
  it('picks the next stock rating up, or none', () => {
    // common practice (no source): stock ratings 1/8, 1/4, 1/2, 1, 2, 3, 5, 10, 25, 50 W.
    expect(wattageAtOrAbove(0.2)).toBe(0.25);
    expect(wattageAtOrAbove(0.25)).toBe(0.25);
    expect(wattageAtOrAbove(0.26)).toBe(0.5);
    expect(wattageAtOrAbove(60)).toBeNull();
  });
});
