import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { ZodError } from 'zod';
import { type KitSpec, type Verdict, checkKit, worst } from '@/lib/electrical';
import { BAD_KINDS, badValue, kitSpecArb, numericLeaves, runs, withValueAt } from './arbitraries';
import { checkOf } from './fixtures';

const RANK: Record<Verdict, number> = { ok: 0, caution: 1, fail: 2 };

describe('properties of checkKit', () => {
  it('never throws on valid finite input, bench-sized or across 600 decades', () => {
    fc.assert(
      fc.property(fc.oneof(kitSpecArb('bench'), kitSpecArb('wide')), (spec) => {
        const r = checkKit(spec);
        expect(['ok', 'caution', 'fail']).toContain(r.verdict);
        expect(r.checks.length).toBeGreaterThan(0);
      }),
      { numRuns: runs(2000) },
    );
  });

  it('the report verdict is always the worst check', () => {
    fc.assert(
      fc.property(kitSpecArb('bench'), (spec) => {
        const r = checkKit(spec);
        expect(r.verdict).toBe(worst(r.checks.map((c) => c.verdict)));
        const hardest = Math.max(...r.checks.map((c) => RANK[c.verdict]));
        expect(RANK[r.verdict]).toBe(hardest);
      }),
      { numRuns: runs(1000) },
    );
  });

  it('raising the supply voltage never makes the headroom verdict worse (resistor: the typical current)', () => {
    fc.assert(
      fc.property(
        fc.oneof(kitSpecArb('bench'), kitSpecArb('wide')),
        fc.array(fc.double({ min: Number.MIN_VALUE, max: 1000, noNaN: true }), { minLength: 2, maxLength: 12 }),
        (spec, volts) => {
          const id = spec.driver.type === 'resistor' ? 'typical-current' : 'headroom';
          const ranks = [...volts]
            .sort((a, b) => a - b)
            .map((v) => RANK[checkOf(checkKit({ ...spec, supply: { ...spec.supply, volts: v } }), id).verdict]);
          for (let i = 1; i < ranks.length; i++) expect(ranks[i]).toBeLessThanOrEqual(ranks[i - 1]);
        },
      ),
      { numRuns: runs(500) },
    );
  });

  it('no accepted input puts NaN, ±Infinity or null anywhere in the report', () => {
    fc.assert(
      fc.property(fc.oneof(kitSpecArb('bench'), kitSpecArb('wide')), (spec) => {
        const r = checkKit(spec);
        const numbers: number[] = [];
        const walk = (v: unknown) => {
          if (typeof v === 'number') numbers.push(v);
          else if (v === null) numbers.push(Number.NaN);
          else if (typeof v === 'object') Object.values(v as object).forEach(walk);
        };
        walk(r);
        expect(numbers.every(Number.isFinite)).toBe(true);
        expect(JSON.stringify(r)).not.toContain('null');
      }),
      { numRuns: runs(3000) },
    );
  });

  it('more LEDs never lower the string voltage', () => {
    fc.assert(
      fc.property(kitSpecArb('bench'), fc.integer({ min: 1, max: 50 }), (spec, more) => {
        const a = checkKit(spec).figures;
        const b = checkKit({ ...spec, string: { ...spec.string, count: spec.string.count + more } }).figures;
        expect(b.stringVoltsMin).toBeGreaterThanOrEqual(a.stringVoltsMin);
        expect(b.stringVoltsTyp).toBeGreaterThanOrEqual(a.stringVoltsTyp);
        expect(b.stringVoltsMax).toBeGreaterThanOrEqual(a.stringVoltsMax);
      }),
      { numRuns: runs(500) },
    );
  });

  it('PWM dimming never raises the average LED current or the LED power', () => {
    fc.assert(
      fc.property(kitSpecArb('bench'), fc.double({ min: 0.001, max: 1, noNaN: true }), (spec, duty) => {
        const full = checkKit({ ...spec, pwmDuty: undefined });
        const dim = checkKit({ ...spec, pwmDuty: duty });
        expect(dim.figures.ledAmpsAvg).toBeLessThanOrEqual(full.figures.ledAmpsAvg);
        expect(checkOf(dim, 'led-power').value).toBeLessThanOrEqual(checkOf(full, 'led-power').value);
        expect(dim.figures.ledAmpsPeak).toBe(full.figures.ledAmpsPeak);
      }),
      { numRuns: runs(300) },
    );
  });
});

describe('invalid input always yields a ZodError naming the field', () => {
  it('one bad number anywhere', () => {
    fc.assert(
      fc.property(
        kitSpecArb('bench'),
        fc.nat(),
        fc.constantFrom(...BAD_KINDS, 'nan' as const, 'infinity' as const),
        (spec, pick, kind) => {
          const all = numericLeaves(spec);
          const leaf = all[pick % all.length];
          let error: unknown;
          try {
            checkKit(withValueAt(spec, leaf.path, badValue(kind, leaf)) as KitSpec);
          } catch (e) {
            error = e;
          }
          expect(error).toBeInstanceOf(ZodError);
          expect((error as ZodError).issues.map((i) => i.path.join('.'))).toContain(leaf.path.join('.'));
        },
      ),
      { numRuns: runs(1000) },
    );
  });

  it('PWM duty outside (0, 1]', () => {
    fc.assert(
      fc.property(
        kitSpecArb('bench'),
        fc.oneof(fc.double({ min: -1e6, max: 0, noNaN: true }), fc.double({ min: 1.000001, max: 1e6, noNaN: true })),
        (spec, duty) => {
          try {
            checkKit({ ...spec, pwmDuty: duty });
          } catch (e) {
            expect(e).toBeInstanceOf(ZodError);
            expect((e as ZodError).issues.map((i) => i.path.join('.'))).toContain('pwmDuty');
            return;
          }
          throw new Error(`duty ${duty} was accepted`);
        },
      ),
    );
  });

  it('forward voltages out of order', () => {
    fc.assert(
      fc.property(kitSpecArb('bench'), fc.double({ min: 1.01, max: 5, noNaN: true }), (spec, factor) => {
        const led = spec.string.led;
        const swapped = { ...spec, string: { ...spec.string, led: { ...led, vfMin: led.vfTyp * factor } } };
        try {
          checkKit(swapped);
        } catch (e) {
          expect((e as ZodError).issues.map((i) => i.path.join('.'))).toContain('string.led.vfMin');
          return;
        }
        throw new Error('reversed forward voltages were accepted');
      }),
    );
  });
});
