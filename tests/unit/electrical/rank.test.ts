import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  type RankQuery,
  type ShelfDriver,
  type ShelfSupply,
  checkKit,
  rankCandidates,
  rankCandidatesNaive,
} from '@/lib/electrical';
import { driverArb, runs, stringArb, supplyArb } from './arbitraries';

const STRING = { count: 6, led: { vfMin: 2.8, vfTyp: 3.0, vfMax: 3.4, maxAmps: 0.7, maxWatts: 3 } };
const SUPPLIES: ShelfSupply[] = [
  { id: 's12', supply: { volts: 12, maxAmps: 2 } },
  { id: 's24', supply: { volts: 24, maxAmps: 2 } },
  { id: 's24-small', supply: { volts: 24, maxAmps: 0.25 } },
  { id: 's28', supply: { volts: 28, maxAmps: 2 } },
  { id: 's36', supply: { volts: 36, maxAmps: 2 } },
  { id: 's48', supply: { volts: 48, maxAmps: 2 } },
];
const DRIVERS: ShelfDriver[] = [
  { id: 'b350-36', driver: { type: 'buck', minInputVolts: 6, maxInputVolts: 36, outputAmps: 0.35 } },
  { id: 'b700-36', driver: { type: 'buck', minInputVolts: 6, maxInputVolts: 36, outputAmps: 0.7 } },
  { id: 'b1000-60', driver: { type: 'buck', minInputVolts: 8, maxInputVolts: 60, outputAmps: 1.0 } },
  { id: 'lin350', driver: { type: 'linear', maxInputVolts: 30, outputAmps: 0.35, dropoutVolts: 1.2 } },
  { id: 'r33', driver: { type: 'resistor', ohms: 33, watts: 5 } },
];

describe('what works with this string', () => {
  it('ranks only passing pairs, ok before caution, then drive, supply use and margin', () => {
    const { candidates } = rankCandidates({ string: STRING, supplies: SUPPLIES, drivers: DRIVERS, limit: 50 });
    expect(candidates.length).toBeGreaterThan(0);
    for (const c of candidates) {
      const again = checkKit({
        supply: SUPPLIES.find((s) => s.id === c.supplyId)!.supply,
        driver: DRIVERS.find((d) => d.id === c.driverId)!.driver,
        string: STRING,
      });
      expect(again.verdict).toBe(c.verdict);
      expect(again.verdict).not.toBe('fail');
    }
    const rank = candidates.map((c) => (c.verdict === 'ok' ? 0 : 1));
    expect([...rank].sort()).toEqual(rank);
    for (let i = 1; i < candidates.length; i++) {
      const [a, b] = [candidates[i - 1], candidates[i]];
      if (a.verdict !== b.verdict) continue;
      expect(b.drive).toBeLessThanOrEqual(a.drive);
      if (a.drive === b.drive) expect(b.supplyUse).toBeLessThanOrEqual(a.supplyUse);
      if (a.drive === b.drive && a.supplyUse === b.supplyUse) expect(b.margin).toBeLessThanOrEqual(a.margin);
    }
    const ids = candidates.map((c) => `${c.supplyId}+${c.driverId}`);
    // 12 V cannot light an 18 V string; 48 V exceeds every driver here; 1 A exceeds the LED's 700 mA
    expect(ids.some((x) => x.startsWith('s12+') || x.startsWith('s48+'))).toBe(false);
    expect(ids.some((x) => x.endsWith('+b1000-60'))).toBe(false);
    // 24 V / 350 mA buck is the everyday answer (caution on duty at worst case); 28 V clears it
    expect(ids).toContain('s28+b350-36');
    expect(candidates[0].verdict).toBe('ok');
    for (const c of candidates) expect(c.reason).toMatch(/drives the LEDs at .* of their rating; uses \d+ % of the supply's current/);
  });

  it('prefers the driver nearest the LEDs’ rated current: a free 700 mA driver before 350 mA ones', () => {
    // LEDs rated 1 A and 4 W on one shared 2 °C/W heat sink (700 mA at vfMax 3.4 V is 2.38 W, under the
    // 70 % line of 2.8 W; the junction stays near 63 °C).
    const led = { vfMin: 2.8, vfTyp: 3.0, vfMax: 3.4, maxAmps: 1, maxWatts: 4 };
    const drivers: ShelfDriver[] = [
      { id: 'a-350', driver: { type: 'buck', minInputVolts: 6, maxInputVolts: 36, outputAmps: 0.35 } },
      { id: 'b-350', driver: { type: 'buck', minInputVolts: 6, maxInputVolts: 36, outputAmps: 0.35 } },
      { id: 'z-700', driver: { type: 'buck', minInputVolts: 6, maxInputVolts: 36, outputAmps: 0.7 } },
    ];
    const supplies: ShelfSupply[] = [{ id: 's24', supply: { volts: 24, maxAmps: 5 } }];
    const { candidates } = rankCandidates({ string: { count: 3, led }, supplies, drivers, heatSink: { count: 1, cPerW: 2 } });
    expect(candidates.map((c) => c.driverId)).toEqual(['z-700', 'a-350', 'b-350']);
    expect(candidates[0].verdict).toBe('ok');
    // the 350 mA ones pass too, but light the LEDs at a third of their rating
    expect(candidates[1].verdict).toBe('ok');
    expect(candidates[1].drive).toBeCloseTo(0.35, 12);
    expect(candidates[0].drive).toBeCloseTo(0.7, 12);
    expect(candidates[0].reason).toContain('700 mA, 70 % of their rating');
  });

  it('uses the supply sensibly: a well-matched supply before the shelf’s biggest', () => {
    const supplies: ShelfSupply[] = [
      { id: 'big', supply: { volts: 24, maxAmps: 20 } },
      { id: 'fits', supply: { volts: 24, maxAmps: 1 } },
    ];
    const { candidates } = rankCandidates({ string: STRING, supplies, drivers: [DRIVERS[1]], heatSink: { count: 6, cPerW: 5 } });
    // 6 × 3.4 V × 0.7 A / 0.9 / 22.8 V = 0.696 A: 70 % of the 1 A supply, 3 % of the 20 A one
    expect(candidates.map((c) => c.supplyId)).toEqual(['fits', 'big']);
    expect(candidates[0].supplyUse).toBeCloseTo(0.6, 12);
  });

  it('reads shelf specs that carry extra fields of their own', () => {
    const r = rankCandidates({
      string: STRING,
      supplies: [{ id: 'noted', supply: { volts: 28, maxAmps: 2, note: 'bench 3' } as unknown as ShelfSupply['supply'] }],
      drivers: [{ id: 'd', driver: { ...DRIVERS[0].driver, colour: 'green' } as unknown as ShelfDriver['driver'] }],
    });
    expect(r.skippedIds).toEqual([]);
    expect(r.candidates.map((c) => c.supplyId)).toEqual(['noted']);
  });

  it('honours a fixed supply or driver', () => {
    const bySupply = rankCandidates({ string: STRING, supplies: SUPPLIES, drivers: DRIVERS, fixedSupplyId: 's28', limit: 20 });
    expect(bySupply.candidates.every((c) => c.supplyId === 's28')).toBe(true);
    const byDriver = rankCandidates({ string: STRING, supplies: SUPPLIES, drivers: DRIVERS, fixedDriverId: 'b350-36', limit: 20 });
    expect(byDriver.candidates.every((c) => c.driverId === 'b350-36')).toBe(true);
    expect(byDriver.candidates.map((c) => c.supplyId)).toEqual(expect.arrayContaining(['s24', 's28']));
  });

  it('skips shelf records that do not parse instead of failing', () => {
    const r = rankCandidates({
      string: STRING,
      supplies: [...SUPPLIES, { id: 'broken', supply: { volts: -5, maxAmps: 1 } }],
      drivers: DRIVERS,
    });
    expect(r.skippedIds).toEqual(['broken']);
  });

  it('respects the limit', () => {
    expect(rankCandidates({ string: STRING, supplies: SUPPLIES, drivers: DRIVERS, limit: 2 }).candidates).toHaveLength(2);
  });
});

const shelfArb = (maxSupplies: number, maxDrivers: number) =>
  fc.record({
    string: stringArb('bench', 12),
    supplies: fc.array(supplyArb('bench'), { minLength: 0, maxLength: maxSupplies }),
    drivers: fc.array(driverArb('bench'), { minLength: 0, maxLength: maxDrivers }),
    limit: fc.integer({ min: 1, max: 30 }),
    pwmDuty: fc.option(fc.double({ min: 0.05, max: 1, noNaN: true }), { nil: undefined }),
    wiring: fc.option(fc.record({ lengthMeters: fc.double({ min: 0.01, max: 20, noNaN: true }), awg: fc.integer({ min: 10, max: 30 }) }), {
      nil: undefined,
    }),
  });

function query(s: {
  string: RankQuery['string'];
  supplies: ShelfSupply['supply'][];
  drivers: ShelfDriver['driver'][];
  limit: number;
  pwmDuty?: number;
  wiring?: RankQuery['wiring'];
}): RankQuery {
  return {
    string: s.string,
    supplies: s.supplies.map((supply, i) => ({ id: `s${i}`, supply })),
    drivers: s.drivers.map((driver, i) => ({ id: `d${i}`, driver })),
    limit: s.limit,
    pwmDuty: s.pwmDuty,
    wiring: s.wiring,
  };
}

const pairs = (r: ReturnType<typeof rankCandidates>) => r.candidates.map((c) => [c.supplyId, c.driverId, c.verdict, c.drive, c.supplyUse, c.margin, c.reason]);

describe('pruned search gives the naive answers', () => {
  it('on small random shelves', () => {
    fc.assert(
      fc.property(shelfArb(30, 30), (s) => {
        const q = query(s);
        expect(pairs(rankCandidates(q))).toEqual(pairs(rankCandidatesNaive(q)));
      }),
      { numRuns: runs(300) },
    );
  });

  it('on bigger shelves of realistic parts, where the early stop and narrowed windows matter', () => {
    // Realistic parts so many pairs pass and the early stop is exercised.
    const supply = fc.record({
      volts: fc.constantFrom(5, 9, 12, 15, 19, 24, 28, 36, 48),
      tolerancePct: fc.constantFrom(0, 1, 3, 5),
      maxAmps: fc.double({ min: 0.3, max: 10, noNaN: true }),
    });
    const buck = fc.record({
      type: fc.constant('buck' as const),
      minInputVolts: fc.constantFrom(4.5, 6, 8),
      maxInputVolts: fc.constantFrom(24, 30, 36, 40, 48, 60),
      outputAmps: fc.constantFrom(0.2, 0.35, 0.5, 0.7, 1.0),
      efficiency: fc.double({ min: 0.8, max: 0.95, noNaN: true }),
    });
    fc.assert(
      fc.property(
        fc.array(supply, { minLength: 60, maxLength: 80 }),
        fc.array(buck, { minLength: 40, maxLength: 60 }),
        fc.integer({ min: 1, max: 8 }),
        fc.integer({ min: 1, max: 40 }),
        (supplies, drivers, count, limit) => {
          const q = query({ string: { count, led: { vfMin: 2.8, vfTyp: 3.0, vfMax: 3.3, maxAmps: 1, maxWatts: 5 } }, supplies, drivers, limit });
          const fast = rankCandidates(q);
          const slow = rankCandidatesNaive(q);
          expect(pairs(fast)).toEqual(pairs(slow));
          expect(fast.checked).toBeLessThanOrEqual(slow.checked);
        },
      ),
      { numRuns: runs(25, 2) },
    );
  }, 60_000); // a correctness test; the machine may be busy

  it('checks far fewer pairs than the naive loop on a suited shelf', () => {
    const supplies: ShelfSupply[] = [];
    const drivers: ShelfDriver[] = [];
    for (let i = 0; i < 60; i++) supplies.push({ id: `s${i}`, supply: { volts: 5 + (i % 44), maxAmps: 1 + (i % 5) } });
    for (let i = 0; i < 60; i++)
      drivers.push({ id: `d${i}`, driver: { type: 'buck', minInputVolts: 6, maxInputVolts: 20 + (i % 41), outputAmps: 0.2 + (i % 6) * 0.1 } });
    const q = { string: STRING, supplies, drivers, limit: 20 };
    const fast = rankCandidates(q);
    const slow = rankCandidatesNaive(q);
    expect(pairs(fast)).toEqual(pairs(slow));
    expect(slow.checked).toBe(3600);
    expect(fast.checked).toBeLessThan(slow.checked / 2);
  });
});
