import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  type DriverSpec,
  checkKit,
  checkMargin,
  type RankQuery,
  type ShelfDriver,
  type ShelfSupply,
  type StringSpec,
  type SupplySpec,
  rankCandidates,
  rankCandidatesNaive,
} from '@/lib/electrical';
import { runs } from './arbitraries';

// The narrowed search against its oracle, the naive loop over every supply × driver pair: on many seeded
// random small shelves the top N must be the same pairs in the same order with the same scores, reasons and
// reports. The shelves are built to sit on the rules' edges, where a pruning bound that is off by a hair
// would drop a pair the full check passes:
//  - supplies whose low end is exactly a buck's need, S_max + headroom (S = N × Vf, Kirchhoff's voltage
//    law; the low end is V × (1 − tolerance), the supply window), S_typ + headroom (the fail edge), the
//    minimum input, or the duty limit's voltage S / (maxDuty × η) (duty D = V_out / (V_in × η), TI
//    SLVA477);
//  - supplies whose high end is exactly a driver's maximum input or the 60 V low-voltage limit (IEC 61140,
//    from memory), and a resistor's supply exactly at S_typ (no typical current);
//  - current ratings that put the worst-case draw exactly on the 80 % caution line (common practice (no
//    source)): a buck's P_in / V_low with P_in = S_max × I × D / η (energy balance), a linear's set current;
//  - set currents on the 5 % drive steps of the LED rating and exactly at it, and tolerances of 0 and 50 %;
//  - twins: the same part under two ids, so only the ids settle the order (the order is the product's own
//    choice: common practice (no source)).

const SEED = 20_261_202;

type Recipe = { kind: number; pick: number; tol: number; amps: number; volts: number };

const ledArb = fc
  .record({
    count: fc.integer({ min: 1, max: 8 }),
    vfTyp: fc.double({ min: 1.8, max: 3.6, noNaN: true }),
    lowBy: fc.constantFrom(1, 0.95, 0.9, 0.85),
    highBy: fc.constantFrom(1, 1.05, 1.1, 1.2),
    maxAmps: fc.constantFrom(0.02, 0.35, 0.7, 1, 1.5),
    wattsBy: fc.double({ min: 0.8, max: 1.6, noNaN: true }),
    thermalOhmsJs: fc.option(fc.constantFrom(2, 8, 15), { nil: undefined }),
  })
  .map(({ count, vfTyp, lowBy, highBy, maxAmps, wattsBy, thermalOhmsJs }): StringSpec => ({
    count,
    led: {
      vfMin: vfTyp * lowBy,
      vfTyp,
      vfMax: vfTyp * highBy,
      maxAmps,
      maxWatts: Math.min(1000, vfTyp * maxAmps * wattsBy),
      ...(thermalOhmsJs !== undefined ? { thermalOhmsJs } : {}),
    },
  }));

/** A set current on one of the LED rating's 5 % steps, exactly at it, just over it, or anywhere. */
const ampsArb = (ledAmps: number) =>
  fc.oneof(
    fc.integer({ min: 1, max: 20 }).map((k) => (ledAmps * k) / 20),
    fc.constant(ledAmps),
    fc.constant(ledAmps * (1 + 1e-12)),
    fc.double({ min: 0.005, max: 2, noNaN: true }),
  );

const driverArb = (string: StringSpec): fc.Arbitrary<DriverSpec> => {
  const ledAmps = string.led.maxAmps;
  // Some minimum inputs above what the string needs (headroom at most 2 V), so that edge decides.
  const above = string.count * string.led.vfMax + 2;
  return fc.oneof(
    fc.record({
      type: fc.constant('buck' as const),
      minInputVolts: fc.oneof(fc.constantFrom(3, 4.5, 6, 8), fc.constantFrom(0.5, 3).map((x) => above + x)),
      maxInputVolts: fc.constantFrom(12, 24, 30, 36, 48, 60),
      outputAmps: ampsArb(ledAmps),
      headroomVolts: fc.constantFrom(0.5, 1, 1.5, 2),
      maxDuty: fc.constantFrom(0.9, 0.95, 1),
      efficiency: fc.constantFrom(0.8, 0.9, 0.95, 1),
      maxOutputVolts: fc.option(fc.constantFrom(10, 20, 30, 60), { nil: undefined }),
      inductorHenries: fc.option(fc.constantFrom(22e-6, 47e-6, 100e-6), { nil: undefined }),
      switchingHz: fc.option(fc.constantFrom(200e3, 500e3, 1e6), { nil: undefined }),
      inductorSatAmps: fc.option(fc.double({ min: 0.1, max: 3, noNaN: true }), { nil: undefined }),
    }),
    fc.record({
      type: fc.constant('linear' as const),
      maxInputVolts: fc.constantFrom(12, 18, 24, 30, 60),
      outputAmps: ampsArb(ledAmps),
      dropoutVolts: fc.constantFrom(0.5, 1, 1.2, 2),
      maxWatts: fc.option(fc.constantFrom(0.5, 1, 3, 10), { nil: undefined }),
      sinkCPerW: fc.option(fc.constantFrom(2, 5, 20), { nil: undefined }),
    }),
    fc.record({
      type: fc.constant('resistor' as const),
      ohms: fc.constantFrom(1, 4.7, 10, 22, 47, 100, 220, 470, 1000),
      watts: fc.constantFrom(0.25, 0.5, 1, 5),
    }),
  ).map((d) => Object.fromEntries(Object.entries(d).filter(([, v]) => v !== undefined)) as DriverSpec);
};

/** The value `weight` times as often as undefined. */
const sometimes = <T>(arb: fc.Arbitrary<T>, weight: number): fc.Arbitrary<T | undefined> =>
  fc.oneof({ arbitrary: fc.constant(undefined), weight: 10 }, { arbitrary: arb, weight: Math.round(weight * 10) });

const recipeArb: fc.Arbitrary<Recipe> = fc.record({
  kind: fc.integer({ min: 0, max: 12 }),
  pick: fc.nat(),
  tol: fc.constantFrom(0, 0, 1, 5, 10, 50),
  amps: fc.double({ min: 0.01, max: 8, noNaN: true }),
  volts: fc.double({ min: 1, max: 70, noNaN: true }),
});

/** A supply built on one edge of a driver on the shelf (or anywhere, for the plain kinds). */
function supplyFrom(r: Recipe, string: StringSpec, drivers: DriverSpec[], pwmDuty: number | undefined): SupplySpec {
  const t = r.tol / 100;
  const n = string.count;
  const { vfTyp, vfMax } = string.led;
  const sTyp = n * vfTyp;
  const sMax = n * vfMax;
  const d: DriverSpec | undefined = drivers.length ? drivers[r.pick % drivers.length] : undefined;
  const lowAt = (v: number) => v / (1 - t); // the supply whose low end is v
  const highAt = (v: number) => v / (1 + t); // the supply whose high end is v
  let volts = r.volts;
  let maxAmps = r.amps;
  const extra = d?.type === 'buck' ? (d.headroomVolts ?? 1.5) : d?.type === 'linear' ? d.dropoutVolts : 0;
  switch (r.kind) {
    case 0:
      volts = lowAt(sMax + extra); // worst-case headroom exactly met
      break;
    case 1:
      volts = lowAt(sTyp + extra); // typical headroom exactly met (the fail edge)
      break;
    case 2:
      if (d && d.type !== 'resistor') volts = highAt(d.maxInputVolts); // high end exactly the driver's maximum
      break;
    case 3:
      volts = highAt(60); // high end exactly the low-voltage limit
      break;
    case 4:
      if (d?.type === 'buck') volts = lowAt(d.minInputVolts);
      break;
    case 5:
      if (d?.type === 'buck') volts = lowAt(sMax / ((d.maxDuty ?? 0.95) * (d.efficiency ?? 0.9)));
      break;
    case 6:
      volts = sTyp; // a resistor's typical current is zero here
      break;
    case 9:
      if (d?.type === 'buck') volts = lowAt(sTyp / ((d.maxDuty ?? 0.95) * (d.efficiency ?? 0.9))); // typical duty at its limit
      break;
    case 7:
    case 8: {
      // The worst-case draw exactly on the 80 % line (case 8 on the supply of case 0).
      if (r.kind === 8) volts = lowAt(sMax + extra);
      if (d?.type === 'buck') {
        const pIn = (sMax * d.outputAmps * (pwmDuty ?? 1)) / (d.efficiency ?? 0.9);
        maxAmps = pIn / (volts * (1 - t)) / 0.8;
      } else if (d?.type === 'linear') maxAmps = (d.outputAmps * (pwmDuty ?? 1)) / 0.8;
      break;
    }
    default:
      break; // anywhere
  }
  return { volts: Math.min(1000, volts), tolerancePct: r.tol, maxAmps: Math.min(100, Math.max(0.001, maxAmps)) };
}

const shelfArb = fc
  .record({
    string: ledArb,
    pwmDuty: sometimes(fc.constantFrom(0.25, 0.5, 1), 1),
    heatSink: sometimes(fc.record({ count: fc.integer({ min: 1, max: 8 }), cPerW: fc.constantFrom(0.5, 2, 5) }), 3),
    // A wire run lowers the voltage at the driver, which moves every pair off the supply's edges: rarer.
    wiring: sometimes(fc.record({ lengthMeters: fc.constantFrom(0.5, 2, 10), awg: fc.constantFrom(14, 20, 26) }), 0.3),
    ambientC: sometimes(fc.constantFrom(0, 25, 45), 1),
    limit: fc.integer({ min: 1, max: 8 }),
    recipes: fc.array(recipeArb, { maxLength: 14 }),
    twinSupplies: fc.array(fc.nat(), { maxLength: 3 }),
    twinDrivers: fc.array(fc.nat(), { maxLength: 3 }),
  })
  .chain((s) =>
    fc.array(driverArb(s.string), { maxLength: 10 }).map((drivers) => {
      const supplies = s.recipes.map((r) => supplyFrom(r, s.string, drivers, s.pwmDuty));
      for (const i of s.twinSupplies) if (supplies.length) supplies.push({ ...supplies[i % supplies.length] });
      for (const i of s.twinDrivers) if (drivers.length) drivers.push({ ...drivers[i % drivers.length] });
      return { ...s, supplies, drivers };
    }),
  );

// Ids whose order differs from the shelf's order, so the ids' tie-break is not the loop's order.
const scramble = (prefix: string, i: number) => `${prefix}${String.fromCharCode(97 + ((i * 7) % 26))}${i}`;

function queryOf(s: {
  string: StringSpec;
  supplies: SupplySpec[];
  drivers: DriverSpec[];
  limit: number;
  pwmDuty?: number;
  heatSink?: RankQuery['heatSink'];
  wiring?: RankQuery['wiring'];
  ambientC?: number;
}): RankQuery {
  const supplies: ShelfSupply[] = s.supplies.map((supply, i) => ({ id: scramble('s', i), supply }));
  const drivers: ShelfDriver[] = s.drivers.map((driver, i) => ({ id: scramble('d', i), driver }));
  return {
    string: s.string,
    supplies,
    drivers,
    limit: s.limit,
    ...(s.pwmDuty !== undefined ? { pwmDuty: s.pwmDuty } : {}),
    ...(s.heatSink !== undefined ? { heatSink: s.heatSink } : {}),
    ...(s.wiring !== undefined ? { wiring: s.wiring } : {}),
    ...(s.ambientC !== undefined ? { ambientC: s.ambientC } : {}),
  };
}

describe('the narrowed search answers exactly as the naive loop (seeded, on the rules’ edges)', () => {
  it('same top N — ids, order, verdicts, drive, supply use, margin, reason and report — on random small shelves', () => {
    let nonEmpty = 0;
    let cut = 0;
    let cautions = 0;
    fc.assert(
      fc.property(shelfArb, (s) => {
        const q = queryOf(s);
        const fast = rankCandidates(q);
        const slow = rankCandidatesNaive(q);
        expect(fast.candidates).toEqual(slow.candidates);
        expect(fast.skippedIds).toEqual(slow.skippedIds);
        expect(fast.checked).toBeLessThanOrEqual(slow.checked);
        if (slow.candidates.length) nonEmpty++;
        if (slow.candidates.length === q.limit) cut++;
        if (slow.candidates.some((c) => c.verdict === 'caution')) cautions++;
      }),
      { seed: SEED, numRuns: runs(600, 60) },
    );
    // The shelves exercise what they claim: answers, lists cut at the limit, and cautions among them.
    expect(nonEmpty).toBeGreaterThan(runs(600, 60) / 4);
    expect(cut).toBeGreaterThan(runs(600, 60) / 10);
    expect(cautions).toBeGreaterThan(runs(600, 60) / 20);
  }, 120_000); // a correctness test; the machine may be busy

  it('twins: the same parts under other ids are ranked by their ids alone, as the naive loop ranks them', () => {
    // Four identical supplies and three identical 350 mA bucks for six 0.7 A LEDs on a shared sink: every
    // pair has the same verdict, drive, supply use and margin, so the ids decide the whole list.
    const string: StringSpec = { count: 6, led: { vfMin: 2.8, vfTyp: 3.0, vfMax: 3.4, maxAmps: 0.7, maxWatts: 3 } };
    const supplies: ShelfSupply[] = ['s-d', 's-a', 's-c', 's-b'].map((id) => ({ id, supply: { volts: 28, maxAmps: 1 } }));
    const drivers: ShelfDriver[] = ['d-z', 'd-x', 'd-y'].map((id) => ({
      id,
      driver: { type: 'buck', minInputVolts: 6, maxInputVolts: 36, outputAmps: 0.35 },
    }));
    for (const limit of [1, 5, 12]) {
      const q: RankQuery = { string, supplies, drivers, limit, heatSink: { count: 1, cPerW: 1 } };
      const fast = rankCandidates(q);
      expect(fast.candidates).toEqual(rankCandidatesNaive(q).candidates);
      const ids = fast.candidates.map((c) => `${c.supplyId}+${c.driverId}`);
      expect(ids).toEqual(['s-a+d-x', 's-a+d-y', 's-a+d-z', 's-b+d-x', 's-b+d-y', 's-b+d-z', 's-c+d-x', 's-c+d-y', 's-c+d-z', 's-d+d-x', 's-d+d-y', 's-d+d-z'].slice(0, limit));
    }
  });

  // Six LEDs of Vf 2.8 / 3.0 / 3.4 V (the string is 20.4 V at most: series forward voltages add) on a 350 mA
  // buck at 36 V, 0 % tolerance: the worst-case draw is 20.4 V × 0.35 A / 0.9 / 36 V = 0.220 A (energy
  // balance), and on a 0.3 A supply its margin (0.27) is the smallest of all the checks.
  const string: StringSpec = { count: 6, led: { vfMin: 2.8, vfTyp: 3.0, vfMax: 3.4, maxAmps: 0.7, maxWatts: 3 } };
  const buck: DriverSpec = { type: 'buck', minInputVolts: 6, maxInputVolts: 60, outputAmps: 0.35 };
  const heatSink = { count: 1, cPerW: 1 };

  it('twins whose smallest margin is the supply current’s: a bound a hair short would drop the smaller ids', () => {
    const supplies: ShelfSupply[] = ['s-d', 's-a', 's-c', 's-b'].map((id) => ({ id, supply: { volts: 36, tolerancePct: 0, maxAmps: 0.3 } }));
    const drivers: ShelfDriver[] = ['d-z', 'd-x', 'd-y'].map((id) => ({ id, driver: buck }));
    for (const limit of [1, 2, 4, 7]) {
      const q: RankQuery = { string, supplies, drivers, limit, heatSink };
      const fast = rankCandidates(q);
      expect(fast.candidates).toEqual(rankCandidatesNaive(q).candidates);
      const checks = fast.candidates[0].report.checks;
      expect(checks.find((c) => c.id === 'supply-current')!.value).toBeCloseTo((20.4 * 0.35) / 0.9 / 36, 12);
      expect(fast.candidates[0].margin).toBeCloseTo(1 - (20.4 * 0.35) / 0.9 / 36 / 0.3, 12);
      expect(fast.candidates.map((c) => `${c.supplyId}+${c.driverId}`)).toEqual(
        ['s-a+d-x', 's-a+d-y', 's-a+d-z', 's-b+d-x', 's-b+d-y', 's-b+d-z', 's-c+d-x'].slice(0, limit),
      );
    }
  });

  it('twins whose smallest margin is a check the supply does not touch (LED power): a driver bound a hair short would drop the smaller ids', () => {
    // The LED power per LED is V_f,max × I_peak (the buck's set current plus half its ripple), whatever the
    // supply: P = V × I. Rated 3 % above it, that margin (0.03) is the smallest of every check, and the
    // search bounds each driver by it before it knows the supply. A generous supply keeps the supply's own
    // checks far away.
    const probe = checkKit({ supply: { volts: 36, tolerancePct: 0, maxAmps: 10 }, driver: buck, string, heatSink });
    const watts = probe.checks.find((c) => c.id === 'led-power')!.value;
    const led = { ...string.led, maxWatts: watts / 0.97 };
    const tight: StringSpec = { ...string, led };
    const supplies: ShelfSupply[] = ['s-d', 's-a', 's-c', 's-b'].map((id) => ({ id, supply: { volts: 36, tolerancePct: 0, maxAmps: 10 } }));
    for (const order of [['d-z', 'd-x', 'd-y'], ['d-x', 'd-y', 'd-z'], ['d-y', 'd-z', 'd-x']]) {
      const drivers: ShelfDriver[] = order.map((id) => ({ id, driver: buck }));
      for (const limit of [1, 2, 4, 7]) {
        const q: RankQuery = { string: tight, supplies, drivers, limit, heatSink };
        const fast = rankCandidates(q);
        expect(fast.candidates).toEqual(rankCandidatesNaive(q).candidates);
        const best = fast.candidates[0];
        expect(best.report.checks.find((c) => c.id === 'led-power')!.value / led.maxWatts).toBeCloseTo(0.97, 12);
        expect(best.margin).toBeCloseTo(0.03, 12);
        // LED power is the check that binds: every other check has more room.
        for (const c of best.report.checks) if (c.id !== 'led-power') expect(checkMargin(c), c.id).toBeGreaterThan(0.03);
        expect(fast.candidates.map((c) => `${c.supplyId}+${c.driverId}`)).toEqual(
          ['s-a+d-x', 's-a+d-y', 's-a+d-z', 's-b+d-x', 's-b+d-y', 's-b+d-z', 's-c+d-x'].slice(0, limit),
        );
      }
    }
  });

  it('a supply drawn exactly to the 80 % line is ok and ranks before one drawn to 75 % (common practice (no source))', () => {
    const amps = checkKit({ supply: { volts: 36, tolerancePct: 0, maxAmps: 10 }, driver: buck, string, heatSink }).figures.supplyAmps;
    // Listed first and with the smaller id, the 75 % supply is checked first and fills a list of one.
    const supplies: ShelfSupply[] = [
      { id: 'a-75', supply: { volts: 36, tolerancePct: 0, maxAmps: amps / 0.75 } },
      { id: 'z-80', supply: { volts: 36, tolerancePct: 0, maxAmps: amps / 0.8 } },
    ];
    const q: RankQuery = { string, supplies, drivers: [{ id: 'd', driver: buck }], limit: 1, heatSink };
    const fast = rankCandidates(q);
    expect(fast.candidates).toEqual(rankCandidatesNaive(q).candidates);
    expect(fast.candidates.map((c) => [c.supplyId, c.verdict, c.supplyUse])).toEqual([['z-80', 'ok', 0.8]]);
  });
});
