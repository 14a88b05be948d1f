// The small pieces the rules are built from, tested on their own edges.
import { describe, expect, it } from 'vitest';
import { checkKit, checkMargin, constantPowerDraw, finite, isAbove, isBelow, ledThermal, regulatorJunctionC } from '@/lib/electrical';
import { relativeMargin, verdictAtLeast, verdictAtMost } from '@/lib/electrical/checks';
import { worstBuckRippleAmps } from '@/lib/electrical/circuit';
import { buckSpec, checkOf } from './fixtures';

describe('comparisons with a relative tolerance of 1e-9', () => {
  it('a value within 1e-9 of its limit is at the limit, either side', () => {
    expect(isAbove(100 * (1 + 0.9e-9), 100)).toBe(false);
    expect(isAbove(100 * (1 + 1.1e-9), 100)).toBe(true);
    expect(isBelow(100 * (1 - 0.9e-9), 100)).toBe(false);
    expect(isBelow(100 * (1 - 1.1e-9), 100)).toBe(true);
  });

  it('scales with the size of a negative limit too', () => {
    expect(isAbove(-100 + 0.9e-7, -100)).toBe(false);
    expect(isAbove(-100 + 1.1e-7, -100)).toBe(true);
    expect(isBelow(-100 - 0.9e-7, -100)).toBe(false);
    expect(isBelow(-100 - 1.1e-7, -100)).toBe(true);
  });

  it('a zero limit has no slack', () => {
    expect(isAbove(1e-300, 0)).toBe(true);
    expect(isBelow(-1e-300, 0)).toBe(true);
    expect(isAbove(0, 0)).toBe(false);
  });

  it('verdicts: NaN fails; the caution band is between the two limits', () => {
    expect(verdictAtMost(Number.NaN, 1)).toBe('fail');
    expect(verdictAtLeast(Number.NaN, 1)).toBe('fail');
    expect(verdictAtMost(0.5, 1, 0.8)).toBe('ok');
    expect(verdictAtMost(0.9, 1, 0.8)).toBe('caution');
    expect(verdictAtMost(1.1, 1, 0.8)).toBe('fail');
    expect(verdictAtLeast(2, 1, 1.5)).toBe('ok');
    expect(verdictAtLeast(1.2, 1, 1.5)).toBe('caution');
    expect(verdictAtLeast(0.9, 1, 1.5)).toBe('fail');
    expect(verdictAtMost(Infinity, Infinity)).toBe('ok');
    expect(verdictAtLeast(-Infinity, -Infinity)).toBe('ok');
  });
});

describe('margins for the ranking', () => {
  it('is the room left as a fraction of the limit, by direction', () => {
    expect(relativeMargin('atMost', 0.8, 1)).toBeCloseTo(0.2, 12);
    expect(relativeMargin('atLeast', 12, 10)).toBeCloseTo(0.2, 12);
    expect(relativeMargin('atMost', 1.5, 1)).toBeCloseTo(-0.5, 12);
    expect(relativeMargin('atMost', -3, -2)).toBeCloseTo(0.5, 12);
  });

  it('a zero limit is measured in absolute units; NaN is the worst margin', () => {
    expect(relativeMargin('atLeast', 0.03, 0)).toBeCloseTo(0.03, 12);
    expect(relativeMargin('atMost', Number.NaN, 1)).toBe(-Infinity);
  });

  it('follows each check’s direction', () => {
    expect(checkMargin({ id: 'headroom', value: 15, limit: 12 })).toBeCloseTo(0.25, 12);
    expect(checkMargin({ id: 'supply-current', value: 0.5, limit: 2 })).toBeCloseTo(0.75, 12);
  });
});

describe('finite: what the report carries for numbers that left the float range', () => {
  it.each([
    [3, 3],
    [-0, -0],
    [Infinity, Number.MAX_VALUE],
    [-Infinity, -Number.MAX_VALUE],
    [Number.NaN, 0],
  ])('%f → %f', (x, y) => {
    expect(finite(x)).toBe(y);
  });
});

describe('constant-power draw through a wire', () => {
  it('no wire or no power: the source voltage, nothing lost', () => {
    expect(constantPowerDraw(24, 0, 10)).toEqual({ amps: 10 / 24, volts: 24, collapsed: false });
    expect(constantPowerDraw(24, 1, 0)).toEqual({ amps: 0, volts: 24, collapsed: false });
  });

  it('exactly at the most the wire can deliver (4RP = V²): half the voltage, not collapsed', () => {
    const d = constantPowerDraw(24, 1, 144);
    expect(d.collapsed).toBe(false);
    expect(d.volts).toBeCloseTo(12, 9);
    expect(d.amps).toBeCloseTo(12, 9);
  });

  it('beyond it: collapsed at V / 2R', () => {
    expect(constantPowerDraw(24, 1, 145)).toEqual({ amps: 12, volts: 12, collapsed: true });
  });

  it('underflowed power and voltage draw nothing (no 0 / 0)', () => {
    expect(constantPowerDraw(0, 1, 0).amps).toBe(0);
  });
});

describe('ripple worst case over the string range', () => {
  it('the ends decide when Vin / 2 is outside the range, on either side', () => {
    // Vin 30: the midpoint 15 V is above 11.2–12.8 V, so the top end gives the most ripple
    expect(worstBuckRippleAmps(30, { min: 11.2, max: 12.8 }, 1, 1e-4, 1e5)).toBeCloseTo(((30 - 12.8) * 12.8) / 30 / 10, 12);
    // Vin 20: the midpoint 10 V is below, so the bottom end does
    expect(worstBuckRippleAmps(20, { min: 11.2, max: 12.8 }, 1, 1e-4, 1e5)).toBeCloseTo(((20 - 11.2) * 11.2) / 20 / 10, 12);
    // the midpoint exactly at an end: that end
    expect(worstBuckRippleAmps(22.4, { min: 11.2, max: 12.8 }, 1, 1e-4, 1e5)).toBeCloseTo((11.2 * 11.2) / 22.4 / 10, 12);
  });

  it('no ripple once the string needs more than the input', () => {
    expect(worstBuckRippleAmps(10, { min: 11.2, max: 12.8 }, 1, 1e-4, 1e5)).toBe(0);
  });
});

describe('thermal chains (ΔT = P × ΣR)', () => {
  const led = { thermalOhmsJs: 8, maxJunctionC: 125 };
  it('bare boards and shared sinks', () => {
    expect(ledThermal(1, 3, led, 25, undefined)).toEqual({ junctionC: 75, sinkCPerWNeeded: 65 });
    // 3 LEDs of 1 W on 1 sink of 4 °C/W: sink 25 + 12 = 37, junction 47; needed (100 − 25 − 10) / 3 = 21.67
    const s = ledThermal(1, 3, led, 25, { count: 1, cPerW: 4 });
    expect(s.sinkC).toBe(37);
    expect(s.junctionC).toBe(47);
    expect(s.sinkCPerWNeeded).toBeCloseTo(65 / 3, 12);
  });

  it('no sink can help when the board alone reaches the caution line; zero heat needs no sink at all', () => {
    expect(ledThermal(7.5, 1, led, 25, undefined).sinkCPerWNeeded).toBeUndefined();
    expect(ledThermal(0, 1, led, 25, undefined).sinkCPerWNeeded).toBe(Number.MAX_VALUE);
  });

  it('regulator: case, interface and sink in series, or free air', () => {
    expect(regulatorJunctionC(2, 25, { junctionToCaseCPerW: 5, sinkCPerW: 4.5 })).toBe(45);
    expect(regulatorJunctionC(2, 25, { junctionToCaseCPerW: 5 })).toBe(150);
  });
});

describe('report shape', () => {
  it('optional figures are present only when they apply', () => {
    const plain = checkKit(buckSpec());
    expect(Object.keys(plain.figures).sort()).toEqual(
      [
        'stringVoltsMin',
        'stringVoltsTyp',
        'stringVoltsMax',
        'ledAmpsPeak',
        'ledAmpsAvg',
        'ledWatts',
        'outputWatts',
        'inputWatts',
        'supplyAmps',
        'lossWatts',
        'efficiency',
        'duty',
        'ledJunctionC',
        'sinkCPerWNeeded',
      ].sort(),
    );
    const full = checkKit({
      ...buckSpec({ driver: { inductorHenries: 1e-4, switchingHz: 1e5 }, wiring: { lengthMeters: 1, awg: 20 } }),
      heatSink: { count: 1, cPerW: 2 },
    });
    expect(full.figures).toHaveProperty('rippleAmps');
    expect(full.figures).toHaveProperty('wireDropVolts');
    expect(full.figures).toHaveProperty('sinkC');
    expect(full.figures).not.toHaveProperty('regulatorJunctionC');
    expect(full.figures).not.toHaveProperty('resistorAmpsMax');
  });

  it('a check’s value and limit are its own numbers', () => {
    const c = checkOf(checkKit(buckSpec()), 'supply-current');
    expect(c.limit).toBe(10);
    expect(c.unit).toBe('A');
  });
});
