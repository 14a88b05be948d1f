import { describe, expect, it } from 'vitest';
import {
  type ShelfDriver,
  type ShelfSupply,
  checkKit,
  checkMargin,
  compareCandidates,
  rankCandidates,
  rankCandidatesNaive,
} from '@/lib/electrical';

// The ranking's order, one key at a time (lib/electrical/README.md, "Ranking"): ok before caution, then
// drive nearest the LEDs' rating in 5 % steps, then the supply's current used most in 10 % steps, then the
// most margin, then the ids. The order itself is the product's own choice: common practice (no source).

type R = Parameters<typeof compareCandidates>[0];
const base: R = { supplyId: 's1', driverId: 'd1', verdict: 'ok', drive: 0.5, supplyUse: 0.5, margin: 0.2 };
const cmp = (a: Partial<R>, b: Partial<R>) => compareCandidates({ ...base, ...a }, { ...base, ...b });

describe('the ranking order, key by key', () => {
  it('a pair is equal to itself (no key tells them apart)', () => {
    expect(cmp({}, {})).toBe(0);
  });

  it('ok before caution, whatever the other keys', () => {
    expect(cmp({ verdict: 'ok', drive: 0.1, supplyUse: 0.1, margin: 0 }, { verdict: 'caution', drive: 1, supplyUse: 1, margin: 1 })).toBeLessThan(0);
    expect(cmp({ verdict: 'caution' }, { verdict: 'ok' })).toBeGreaterThan(0);
  });

  it('then the driver nearest the LEDs’ rating, by 5 % steps', () => {
    expect(cmp({ drive: 0.7, supplyUse: 0, margin: 0 }, { drive: 0.35, supplyUse: 1, margin: 1 })).toBeLessThan(0);
    expect(cmp({ drive: 0.35 }, { drive: 0.7 })).toBeGreaterThan(0);
    // inside one step the next key decides: 0.70 and 0.74 are the same step (0.74 / 0.05 = 14.8)
    expect(cmp({ drive: 0.7, supplyUse: 0.2 }, { drive: 0.74, supplyUse: 0.6 })).toBeGreaterThan(0);
    expect(cmp({ drive: 0.74, supplyUse: 0.6 }, { drive: 0.7, supplyUse: 0.2 })).toBeLessThan(0);
    // float dust stays in its step: 0.7 / 0.05 is 13.999999999999998 in binary, still step 14
    expect(cmp({ drive: 0.7, margin: 0.3 }, { drive: 0.7000000000000001, margin: 0.1 })).toBeLessThan(0);
  });

  it('then the supply whose current rating is used most, by 10 % steps', () => {
    expect(cmp({ supplyUse: 0.6, margin: 0 }, { supplyUse: 0.3, margin: 1 })).toBeLessThan(0);
    expect(cmp({ supplyUse: 0.3 }, { supplyUse: 0.6 })).toBeGreaterThan(0);
    // 0.61 and 0.69 share a step: the margin decides
    expect(cmp({ supplyUse: 0.61, margin: 0.1 }, { supplyUse: 0.69, margin: 0.4 })).toBeGreaterThan(0);
  });

  it('then the most margin', () => {
    expect(cmp({ margin: 0.4, supplyId: 'z' }, { margin: 0.1, supplyId: 'a' })).toBeLessThan(0);
    expect(cmp({ margin: 0.1 }, { margin: 0.4 })).toBeGreaterThan(0);
  });

  it('then the supply id, then the driver id, so the order is stable', () => {
    expect(cmp({ supplyId: 'a', driverId: 'z' }, { supplyId: 'b', driverId: 'a' })).toBe(-1);
    expect(cmp({ supplyId: 'b', driverId: 'a' }, { supplyId: 'a', driverId: 'z' })).toBe(1);
    expect(cmp({ driverId: 'a' }, { driverId: 'b' })).toBe(-1);
    expect(cmp({ driverId: 'b' }, { driverId: 'a' })).toBe(1);
  });

  it('sorts a list into that order', () => {
    const list: R[] = [
      { ...base, supplyId: 's9', verdict: 'caution', drive: 1 },
      { ...base, supplyId: 's8', drive: 0.35 },
      { ...base, supplyId: 's7', drive: 0.7, supplyUse: 0.3 },
      { ...base, supplyId: 's6', drive: 0.7, supplyUse: 0.6, margin: 0.1 },
      { ...base, supplyId: 's5', drive: 0.7, supplyUse: 0.6, margin: 0.3 },
      { ...base, supplyId: 's4', drive: 0.7, supplyUse: 0.6, margin: 0.3, driverId: 'd0' },
    ];
    expect([...list].sort(compareCandidates).map((c) => `${c.supplyId}/${c.driverId}`)).toEqual([
      's4/d0',
      's5/d1',
      's6/d1',
      's7/d1',
      's8/d1',
      's9/d1',
    ]);
  });
});

// Six LEDs rated 0.7 A / 3 W with Vf 2.8 / 3.0 / 3.4 V: the string is 16.8 / 18.0 / 20.4 V (Kirchhoff's
// voltage law: series forward voltages add).
const STRING = { count: 6, led: { vfMin: 2.8, vfTyp: 3.0, vfMax: 3.4, maxAmps: 0.7, maxWatts: 3 } };
const B350 = { type: 'buck', minInputVolts: 6, maxInputVolts: 36, outputAmps: 0.35 } as const;
const R33 = { type: 'resistor', ohms: 33, watts: 5 } as const;

describe('the reason beside each candidate', () => {
  const r = rankCandidates({
    string: STRING,
    supplies: [
      { id: 's24', supply: { volts: 24, maxAmps: 2 } },
      { id: 's28', supply: { volts: 28, maxAmps: 2 } },
    ],
    drivers: [
      { id: 'b', driver: B350 },
      { id: 'r', driver: R33 },
    ],
    limit: 10,
  });
  const by = (s: string, d: string) => r.candidates.find((c) => c.supplyId === s && c.driverId === d)!;

  it('a buck: its set current against the LED rating, and the worst-case supply draw against the rating', () => {
    // 350 mA / 700 mA = 50 %; supply draw S_max × I / η / V_low = 20.4 × 0.35 / 0.9 / 26.6 = 0.298 A
    // (energy balance, TI SLVA477; 28 V − 5 % = 26.6 V), 14.9 % of 2 A, printed to the percent.
    expect(by('s28', 'b').reason).toBe("drives the LEDs at 350 mA, 50 % of their rating; uses 15 % of the supply's current");
    expect(by('s28', 'b').drive).toBe(0.5);
    expect(by('s28', 'b').supplyUse).toBe(0.1);
  });

  it('a caution is named in the reason', () => {
    // 24 V: worst-case duty 20.4 / (22.8 × 0.9) = 0.994 > 0.95 (SLVA477 duty) — caution; draw 0.348 A = 17 %
    expect(by('s24', 'b').verdict).toBe('caution');
    expect(by('s24', 'b').reason).toBe(
      "drives the LEDs at 350 mA, 50 % of their rating; uses 17 % of the supply's current; caution: duty",
    );
  });

  it('a resistor: the worst-case current in the reason, the typical one for the drive step', () => {
    // I_max = (25.2 − 16.8) / 33 = 0.2545 A (Ohm's law) = 36 % of 0.7 A; the supply carries the same current,
    // 13 % of 2 A. Drive step from the typical current (24 − 18) / 33 = 0.182 A = 26 % → the 25 % step.
    const c = by('s24', 'r');
    expect(c.reason).toBe("drives the LEDs at 255 mA, 36 % of their rating; uses 13 % of the supply's current");
    expect(c.drive).toBe(0.25);
    // 28 V: I_max = (29.4 − 16.8) / 33 = 0.382 A, 0.382² × 33 = 4.81 W, over half the 5 W rating (Joule;
    // the 50 % line is common practice (no source)); typical (28 − 18) / 33 = 0.303 A = 43 % → 40 % step.
    expect(by('s28', 'r').reason).toBe(
      "drives the LEDs at 382 mA, 55 % of their rating; uses 19 % of the supply's current; caution: resistor-power",
    );
    expect(by('s28', 'r').drive).toBe(0.4);
  });

  it('the margin is the smallest over all the report’s checks', () => {
    for (const c of r.candidates) expect(c.margin).toBe(Math.min(...c.report.checks.map(checkMargin)));
    expect(r.candidates.map((c) => `${c.supplyId}+${c.driverId}`)).toEqual(['s28+b', 's24+r', 's24+b', 's28+r']);
  });
});

describe('what the ranking reads from its query', () => {
  const many = Array.from({ length: 25 }, (_, i) => ({ id: `s${String(i).padStart(2, '0')}`, supply: { volts: 28, maxAmps: 2 } }));

  it('returns 20 by default, the limit when given, and refuses a limit that is not a whole number of at least 1', () => {
    expect(rankCandidates({ string: STRING, supplies: many, drivers: [{ id: 'b', driver: B350 }] }).candidates).toHaveLength(20);
    expect(rankCandidates({ string: STRING, supplies: many, drivers: [{ id: 'b', driver: B350 }], limit: 1 }).candidates).toHaveLength(1);
    for (const limit of [0, -1, 1.5])
      expect(() => rankCandidates({ string: STRING, supplies: many, drivers: [{ id: 'b', driver: B350 }], limit })).toThrow(RangeError);
  });

  it('leaves out records that are not objects or whose driver type it does not know', () => {
    const r = rankCandidates({
      string: STRING,
      supplies: [
        { id: 'null', supply: null as never },
        { id: 'text', supply: '28 V' as never },
        { id: 'ok', supply: { volts: 28, maxAmps: 2 } },
      ],
      drivers: [
        { id: 'none', driver: null as never },
        { id: 'boost', driver: { type: 'boost', outputAmps: 0.35 } as never },
        { id: 'b', driver: B350 },
      ],
    });
    expect(r.skippedIds).toEqual(['null', 'text', 'none', 'boost']);
    expect(r.candidates.map((c) => `${c.supplyId}+${c.driverId}`)).toEqual(['ok+b']);
  });

  it('validates a shelf record once, however often it is asked about', () => {
    let reads = 0;
    const supply = {
      get volts() {
        reads++;
        return 28;
      },
      maxAmps: 2,
    };
    const q = { string: STRING, supplies: [{ id: 's', supply }], drivers: [{ id: 'b', driver: B350 }] };
    rankCandidates(q);
    const first = reads;
    expect(first).toBeGreaterThan(0);
    rankCandidates(q);
    rankCandidatesNaive(q);
    expect(reads).toBe(first);
  });

  it('checks every pair with the query’s PWM duty, wiring, heat sink and ambient temperature', () => {
    const extras = { pwmDuty: 0.5, wiring: { lengthMeters: 2, awg: 22 }, heatSink: { count: 2, cPerW: 4 }, ambientC: 40 };
    const r = rankCandidates({ string: STRING, supplies: [{ id: 's', supply: { volts: 28, maxAmps: 2 } }], drivers: [{ id: 'b', driver: B350 }], ...extras });
    const direct = checkKit({ supply: { volts: 28, maxAmps: 2 }, driver: B350, string: STRING, ...extras });
    expect(r.candidates[0].report.figures).toEqual(direct.figures);
    expect(r.candidates[0].report.figures.ledAmpsAvg).toBeCloseTo(0.175, 12); // D × I_set = 0.5 × 0.35 A
    expect(r.candidates[0].report.figures.sinkC).toBeDefined();
    expect(r.candidates[0].report.figures.wireDropVolts).toBeGreaterThan(0);
  });
});

describe('the narrowed search checks only pairs that may pass', () => {
  // Drivers, with their windows from the rules that only get worse towards a window's end:
  //  b350: buck 6–36 V in; the low end must reach max(S_typ + 1.5 V headroom, 6 V, S_typ / (0.95 × 0.9)) =
  //        max(19.5, 6, 21.05) = 21.05 V (headroom and duty, SLVA477); the high end at most 36 V.
  //  lin:  linear 30 V in, 1.2 V dropout: low end from S_typ + 1.2 = 19.2 V, high end at most 30 V.
  //  r33:  a resistor: no low bound, high end at most 60 V (the low-voltage limit).
  //  over: 1 A set current, over the LEDs' 0.7 A — fails whatever the supply.
  //  vout: maxOutputVolts 15 V, under S_max 20.4 V — fails whatever the supply.
  //  sat:  inductor saturating at 0.3 A, under the 0.35 A set current — fails whatever the supply.
  //  hot:  0.7 A at vfMax 3.4 V is 2.38 W, over a 2 W LED — but only for the hot string below.
  const drivers = [
    { id: 'b350', driver: B350 },
    { id: 'lin', driver: { type: 'linear', maxInputVolts: 30, outputAmps: 0.35, dropoutVolts: 1.2 } },
    { id: 'r33', driver: { type: 'resistor', ohms: 33, watts: 25 } },
    { id: 'over', driver: { ...B350, outputAmps: 1 } },
    { id: 'vout', driver: { ...B350, maxOutputVolts: 15 } },
    { id: 'sat', driver: { ...B350, inductorSatAmps: 0.3 } },
  ] as ShelfDriver[];
  // Supplies at 0 % tolerance (window = the nominal voltage), one at ±5 % (33.25–36.75 V), one over 60 V.
  const volts = [12, 20, 21, 22, 24, 28, 36, 40, 48, 62];
  const supplies: ShelfSupply[] = [
    ...volts.map((v) => ({ id: `v${v}`, supply: { volts: v, tolerancePct: 0, maxAmps: 3 } })),
    { id: 'v35t', supply: { volts: 35, tolerancePct: 5, maxAmps: 3 } },
  ];

  it('checks exactly the supplies inside each driver’s window, and answers as the full loop', () => {
    const q = { string: STRING, supplies, drivers, limit: 100 };
    const fast = rankCandidates(q);
    const slow = rankCandidatesNaive(q);
    expect(slow.checked).toBe(11 * 6);
    // b350: 22, 24, 28, 36 (35 ± 5 % reaches 36.75 V, over 36) = 4; lin: 20, 21, 22, 24, 28 = 5;
    // r33: every supply up to 60 V = 10; over, vout, sat: none.
    // At most the pairs inside the windows; the pairs' own bounds skip some that certainly fail (r33 on
    // 12 V: no typical current; on 40 and 48 V: (V − 16.8 V) / 33 Ω is over 0.7 A, Ohm's law).
    expect(fast.checked).toBeLessThanOrEqual(4 + 5 + 10);
    expect(fast.checked).toBeLessThan(4 + 5 + 10 - 1);
    expect(fast.candidates.map((c) => [c.supplyId, c.driverId])).toEqual(slow.candidates.map((c) => [c.supplyId, c.driverId]));
    expect(fast.candidates.length).toBeGreaterThan(0);
  });

  it('drops a driver whose worst-case LED power is over the rating whatever the supply, PWM included', () => {
    const hot = { count: 6, led: { ...STRING.led, maxWatts: 2 } };
    const d = [{ id: 'b700', driver: { ...B350, outputAmps: 0.7 } }] as ShelfDriver[];
    expect(rankCandidates({ string: hot, supplies, drivers: d, limit: 100 }).checked).toBe(0);
    // At 50 % PWM the average LED power is 1.19 W, under 2 W: the same driver is checked again, on the
    // supplies inside its window (22, 24, 28, 36 V as for b350).
    const pwm = rankCandidates({ string: hot, supplies, drivers: d, limit: 100, pwmDuty: 0.5 });
    expect(pwm.checked).toBe(4);
    expect(pwm.candidates.map((c) => c.supplyId)).toEqual(
      rankCandidatesNaive({ string: hot, supplies, drivers: d, limit: 100, pwmDuty: 0.5 }).candidates.map((c) => c.supplyId),
    );
  });
});

describe('the search stops once nothing left can enter', () => {
  // LEDs rated 0.7 A / 5 W, six on one 2 °C/W sink each (T_j = 25 + 2.38 × 2 + 2.38 × 10 ≈ 54 °C at 0.7 A,
  // the check's LED junction rule), so a 700 mA buck is ok. Supplies 28 V and 30 V ± 5 %.
  const string = { count: 6, led: { ...STRING.led, maxWatts: 5 } };
  const heatSink = { count: 6, cPerW: 2 };
  const supplies: ShelfSupply[] = [
    { id: 's28', supply: { volts: 28, maxAmps: 2 } },
    { id: 's30', supply: { volts: 30, maxAmps: 2 } },
  ];
  const b700 = { ...B350, outputAmps: 0.7 } as const;

  it('a list full of ok pairs driving better than the next driver can: the rest is not checked', () => {
    const q = { string, heatSink, supplies, drivers: [{ id: 'b350', driver: B350 }, { id: 'b700', driver: b700 }], limit: 1 };
    const fast = rankCandidates(q);
    // Both supplies draw 27.8–29.8 % of their rating (the same 10 % step) and the smallest margin is the
    // LED current's (0.7 A set, 0.7 A rated: 0), the same on both: the ids settle it.
    expect(fast.candidates.map((c) => [c.supplyId, c.driverId, c.verdict, c.drive])).toEqual([['s28', 'b700', 'ok', 1]]);
    // b700 (drive 100 %) is visited first and its first supply fills the list with an ok pair; s30 can at
    // best tie it (same steps, margin at most the LED current's 0) and loses on its id; b350 (50 % at best)
    // is skipped.
    expect(fast.checked).toBe(1);
    expect(rankCandidatesNaive(q).candidates.map((c) => [c.supplyId, c.driverId])).toEqual([['s28', 'b700']]);
  });

  it('a driver that can reach the same drive step is still checked: it may win on the later keys', () => {
    // Two identical 700 mA drivers; the ids settle the tie, so the one listed second must still be tried.
    const q = { string, heatSink, supplies, drivers: [{ id: 'z700', driver: b700 }, { id: 'a700', driver: b700 }], limit: 1 };
    const fast = rankCandidates(q);
    expect(fast.candidates.map((c) => c.driverId)).toEqual(['a700']);
    // Each driver is tried on s28; s30 can at best tie on every key and loses on its id.
    expect(fast.checked).toBe(2);
  });

  it('a list full of caution pairs does not stop the search: an ok pair at a lower drive still comes first', () => {
    // 0.7 A × 3.4 V = 2.38 W is over 70 % of a 3.3 W LED: caution (common practice (no source)); 350 mA
    // (1.19 W) is ok. Ok comes before caution whatever the drive.
    const warm = { count: 6, led: { ...STRING.led, maxWatts: 3.3 } };
    const q = { string: warm, heatSink, supplies, drivers: [{ id: 'b700', driver: b700 }, { id: 'b350', driver: B350 }], limit: 1 };
    const fast = rankCandidates(q);
    expect(fast.candidates.map((c) => [c.driverId, c.verdict])).toEqual([['b350', 'ok']]);
    // b700 on s28 (caution), then b350 on s28 and s30: the caution did not stop the search.
    expect(fast.checked).toBe(3);
  });
});
