import { describe, expect, it } from 'vitest';
import { checkLines, readStoredReport, storedReport, type CheckLine } from '@/lib/loans/check';
import { gateFor } from '@/lib/loans/preview';

// The lending gate on top of the check: which verdict blocks, which needs an acknowledgement, and how
// incomplete chains count for a kit box versus loose parts. The electrical limits themselves are tested
// in tests/unit/electrical; the parts here are chosen far from any threshold.
const supply = (volts: number, maxAmps = 2): CheckLine => ({
  partId: `s${volts}`,
  name: `${volts} V supply`,
  category: 'supply',
  specs: { volts, tolerancePct: 5, maxAmps },
  qty: 1,
  chainRole: 'supply',
});
const driver: CheckLine = {
  partId: 'd',
  name: '350 mA buck',
  category: 'driver',
  specs: { type: 'buck', minInputVolts: 6, maxInputVolts: 36, outputAmps: 0.35 },
  qty: 1,
  chainRole: 'driver',
};
const leds = (n: number): CheckLine => ({
  partId: 'l',
  name: 'white LED',
  category: 'led',
  specs: { vfMin: 2.9, vfTyp: 3.2, vfMax: 3.6, maxAmps: 0.7, maxWatts: 3 },
  qty: n,
  chainRole: 'led',
});
const meter: CheckLine = {
  partId: 'm',
  name: 'meter',
  category: 'meter',
  specs: {},
  qty: 1,
  chainRole: null,
};

describe('lending gate', () => {
  it('a buck cannot lift 12 V to a 6-LED string: fail → blocked, with advice', () => {
    // 6 × 3.2 V = 19.2 V typical string; a buck (step-down) converter's output is below its input
    // (duty D = Vout / Vin ≤ 1, any power-electronics textbook), so 12 V cannot drive it.
    const out = checkLines([supply(12), driver, leds(6)], { fromKitBox: true });
    expect(out.kind).toBe('checked');
    expect(out.verdict).toBe('fail');
    expect(gateFor(out)).toBe('blocked');
    if (out.kind === 'checked') expect(out.changes.length).toBeGreaterThan(0);
  });

  it('three LEDs from 24 V through the same driver is not blocked', () => {
    // 3 × 3.6 V = 10.8 V worst case plus 1.5 V headroom ≪ 22.8 V (24 V − 5 %).
    const out = checkLines([supply(24), driver, leds(3)], { fromKitBox: true });
    expect(out.verdict).not.toBe('fail');
    expect(gateFor(out)).not.toBe('blocked');
  });

  it('two bins of the same LED make one string', () => {
    const a = checkLines(
      [supply(24), driver, { ...leds(2), chainRole: null }, { ...leds(1), chainRole: null }],
      { fromKitBox: false },
    );
    expect(a.kind).toBe('checked');
    if (a.kind === 'checked') expect(a.chain.ledCount).toBe(3);
  });

  it('half a chain: blocked in a kit box, simply not checked for loose parts', () => {
    const box = checkLines([supply(24), driver], { fromKitBox: true });
    expect(box.kind).toBe('incomplete');
    expect(gateFor(box)).toBe('blocked');
    const loose = checkLines([supply(24), driver], { fromKitBox: false });
    expect(loose.kind).toBe('incomplete');
    expect(gateFor(loose)).toBe('ok');
  });

  it('nothing electrical: nothing to check, general cautions still shown', () => {
    const out = checkLines([meter], { fromKitBox: false });
    expect(out.kind).toBe('none');
    expect(gateFor(out)).toBe('ok');
    expect(out.cautions.map((c) => c.id)).toContain('fixed-wiring');
  });

  it('a part whose stored specs cannot feed the check blocks the loan and names the part', () => {
    const broken = { ...driver, specs: { type: 'buck', minInputVolts: 6, outputAmps: 0.35 } };
    const out = checkLines([supply(24), broken, leds(3)], { fromKitBox: true });
    expect(out.kind).toBe('unreadable');
    expect(gateFor(out)).toBe('blocked');
    if (out.kind === 'unreadable') expect(out.problems.join(' ')).toContain('350 mA buck');
  });

  it('the stored report reads back with its verdict inputs and cautions', () => {
    const out = checkLines([supply(24), driver, leds(3)], { fromKitBox: true });
    const back = readStoredReport(JSON.parse(JSON.stringify(storedReport(out))));
    expect(back?.kind).toBe('checked');
    expect(back?.report?.verdict).toBe(out.verdict);
    expect(back?.cautions.length).toBe(out.cautions.length);
    // The demo seed stored { spec, report } only: cautions are derived again.
    const legacy = readStoredReport({
      spec: out.kind === 'checked' ? out.spec : null,
      report: out.kind === 'checked' ? out.report : null,
    });
    expect(legacy?.kind).toBe('checked');
    expect(legacy?.cautions.some((c) => c.id === 'eyes')).toBe(true);
  });
});
