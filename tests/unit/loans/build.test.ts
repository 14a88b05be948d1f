import { describe, expect, it } from 'vitest';
import { buildNote, checkBuild, ownPartLines, refusalReasons, type BuildLine } from '@/lib/loans/build';
import { heatSinkOf } from '@/lib/kits/chain';

// The whole-build gate without a database: which chains a member's parts make, which of them this
// borrow touches, and what an incomplete build says. Electrical limits are tested in
// tests/unit/electrical; the one relied on here is far from its threshold: a 48 V ±5 % supply
// (45.6–50.4 V) is above a 36 V driver's maximum input (the driver's rating; the input-range rule).

const line = (over: Partial<BuildLine> & Pick<BuildLine, 'partId' | 'name' | 'category' | 'specs'>): BuildLine => ({
  qty: 1,
  chainRole: null,
  fresh: false,
  own: false,
  ...over,
});
const supply = (volts: number, fresh = false) =>
  line({ partId: `s${volts}`, name: `${volts} V supply`, category: 'supply', specs: { volts, tolerancePct: 5, maxAmps: 2 }, fresh });
const driver = (fresh = false) =>
  line({
    partId: 'd',
    name: '350 mA buck',
    category: 'driver',
    specs: { type: 'buck', minInputVolts: 6, maxInputVolts: 36, outputAmps: 0.35 },
    fresh,
  });
const leds = (qty: number, fresh = false) =>
  line({
    partId: 'l',
    name: 'white LED',
    category: 'led',
    specs: { vfMin: 2.9, vfTyp: 3.2, vfMax: 3.6, maxAmps: 0.7, maxWatts: 3 },
    qty,
    fresh,
  });

describe('the whole build', () => {
  it('finding 9: supply and driver held, LEDs fresh → the chain is checked and fails', () => {
    const out = checkBuild([supply(48), driver()], [leds(3, true)]);
    expect(out.kind).toBe('checked');
    expect(out.verdict).toBe('fail');
    expect(out.build?.held).toEqual(['48 V supply', '350 mA buck']);
    expect(refusalReasons(out)[0]).toBe('Your whole build 48 V supply → 350 mA buck → 3 × white LED gives fail');
  });

  it('an incomplete build is not blocking and says what it has so far', () => {
    const out = checkBuild([], [supply(48, true), driver(true)]);
    expect(out).toMatchObject({ kind: 'incomplete', verdict: null, missing: ['LEDs for the string'] });
    expect(out.build?.present).toEqual(['48 V supply', '350 mA buck']);
    expect(buildNote(out)).toBe(
      'Your build is not complete yet: it still needs LEDs for the string. When you borrow it, or describe ' +
        'your own, the whole build is checked against 48 V supply, 350 mA buck.',
    );
  });

  it('a steward lending for someone reads about their build, not "your" build', () => {
    const incomplete = checkBuild([], [supply(48, true), driver(true)]);
    expect(buildNote(incomplete, { self: false })).toBe(
      'Their build is not complete yet: it still needs LEDs for the string. When they borrow it, or describe ' +
        'their own, the whole build is checked against 48 V supply, 350 mA buck.',
    );
    const failing = checkBuild([supply(48), driver()], [leds(3, true)]);
    expect(refusalReasons(failing, { self: false })[0]).toBe(
      'Their whole build 48 V supply → 350 mA buck → 3 × white LED gives fail',
    );
    const held = checkBuild([supply(24), driver()], [leds(3, true)]);
    expect(buildNote(held, { self: false })).toMatch(/^Checked as one build together with what they already have out \(/);
  });

  it('every chain through a fresh part is checked; the worst decides', () => {
    // 24 V with this driver and three LEDs passes; 48 V does not. A fresh LED bag meets both supplies.
    const out = checkBuild([supply(24), supply(48), driver()], [leds(3, true)]);
    expect(out.verdict).toBe('fail');
    expect(out.build?.chains.map((c) => [c.chain.supply, c.verdict])).toEqual([
      ['24 V supply', 'ok'],
      ['48 V supply', 'fail'],
    ]);
  });

  it('chains made only of parts already out are not checked again (they were gated when they went out)', () => {
    // A steward let the 48 V chain out with an override; a fresh 24 V supply is checked on its own chain.
    const out = checkBuild([supply(48), driver(), leds(3)], [supply(24, true)]);
    expect(out.verdict).toBe('ok');
    expect(out.build?.chains).toHaveLength(1);
  });

  it('two loans of the same LED make one string', () => {
    const out = checkBuild([supply(24), driver(), leds(3)], [leds(3, true)]);
    expect(out.kind === 'checked' && out.chain.ledCount).toBe(6);
  });

  it('own LEDs are lines of the build under their own name', () => {
    const own = ownPartLines({ string: { count: 3, led: { vfMin: 2.9, vfTyp: 3.2, vfMax: 3.6, maxAmps: 0.7, maxWatts: 3 } } } as never, 'new', true);
    const out = checkBuild([supply(48), driver()], own);
    expect(out.verdict).toBe('fail');
    expect(out.build?.own).toEqual(["3 × the borrower's own LEDs"]);
  });

  it('own parts are named for whoever reads the loan later, not as "your" (a steward reads other people\'s loans)', () => {
    const own = ownPartLines(
      {
        supply: { volts: 24, maxAmps: 2 },
        driver: { type: 'buck' },
        string: { count: 3, led: { vfMin: 2.9, vfTyp: 3.2, vfMax: 3.6, maxAmps: 0.7, maxWatts: 3 } },
        heatSink: { count: 3, cPerW: 8 },
      } as never,
      'new',
      true,
    );
    expect(own.map((l) => l.name)).toEqual([
      "the borrower's own 24 V supply",
      "the borrower's own buck driver",
      "the borrower's own LEDs",
      "the borrower's own heat sinks (8 °C/W)",
    ]);
  });
});

describe('heat sinks from the shelf', () => {
  const sink = (name: string, cPerW: number | undefined, qty: number) => ({
    name,
    qty,
    specs: cPerW === undefined ? {} : { celsiusPerWatt: cPerW },
  });
  it('count and °C/W come from the box; mixed sizes count as the weakest', () => {
    expect(heatSinkOf([sink('fin', 4, 2)], 8)).toEqual({
      spec: { count: 2, cPerW: 4 },
      words: '2 × fin (4 °C/W each)',
    });
    expect(heatSinkOf([sink('fin', 4, 1), sink('round', 9, 1)], 4)?.spec).toEqual({ count: 2, cPerW: 9 });
  });
  it('sinks beyond one per LED take no extra heat; a sink without °C/W is not counted on', () => {
    expect(heatSinkOf([sink('round', 9, 6)], 4)?.spec.count).toBe(4);
    expect(heatSinkOf([sink('bare', undefined, 2)], 4)).toBeNull();
  });
});
