// Issue #10, finding 8 ("crashes and garbage"), through real HTTP against the production build that
// scripts/test.sh starts: /compare answered 500 for a 1e-310 A current and a 1e308 V supply, and
// /api/bench-check returned null figures on overflow. Each answer must be a 2xx with finite figures or a
// 4xx naming the field.
import { describe, expect, it } from 'vitest';
import { firstNonFinite } from '@/lib/bench-check';
import { BASE } from '../helpers/http';
import { buckSpec, linearSpec, resistorSpec } from '../unit/electrical/fixtures';

const post = async (path: string, body: unknown) => {
  const res = await fetch(BASE + path, {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: typeof body === 'string' ? body : JSON.stringify(body),
    redirect: 'manual',
  });
  const text = await res.text();
  let json: unknown = null;
  try {
    json = JSON.parse(text);
  } catch {
    /* kept as text in the failure message */
  }
  return { status: res.status, json: json as { error?: { code: string; message: string; fields?: Record<string, string[]> } } & Record<string, unknown>, text };
};

const fieldsOf = (json: { error?: { fields?: Record<string, string[]> } }) => Object.keys(json?.error?.fields ?? {});
const buck = buckSpec();

describe('POST /api/bench-check/compare never answers 500', () => {
  it('a 1e-310 A drive current is a 400 naming amps', async () => {
    const r = await post('/api/bench-check/compare', { string: buck.string, supply: buck.supply, amps: 1e-310 });
    expect(r.status, r.text).toBe(400);
    expect(r.json.error?.code).toBe('invalid');
    expect(fieldsOf(r.json)).toEqual(['amps']);
  });

  it('a 1e308 V supply is a 400 naming supply.volts', async () => {
    const r = await post('/api/bench-check/compare', { string: buck.string, supply: { ...buck.supply, volts: 1e308 } });
    expect(r.status, r.text).toBe(400);
    expect(fieldsOf(r.json)).toContain('supply.volts');
  });

  it.each([
    ['5e-324 A (the smallest double)', 5e-324],
    ['-0 A', -0],
    ['an amp count past 100 A', 1e6],
  ])('%s is a 400 naming amps', async (_what, amps) => {
    const r = await post('/api/bench-check/compare', { string: buck.string, supply: buck.supply, amps });
    expect(r.status, r.text).toBe(400);
    expect(fieldsOf(r.json)).toEqual(['amps']);
  });

  it('an unknown key is a 400 naming that key, not silently dropped', async () => {
    const r = await post('/api/bench-check/compare', { string: buck.string, supply: buck.supply, amp: 0.35 });
    expect(r.status, r.text).toBe(400);
    expect(fieldsOf(r.json)).toEqual(['amp']);
  });

  it('the smallest and largest accepted currents give finite rows', async () => {
    for (const amps of [1e-4, 100]) {
      const r = await post('/api/bench-check/compare', { string: buck.string, supply: buck.supply, amps });
      expect(r.status, r.text).toBe(200);
      expect(firstNonFinite(r.json), r.text).toBeNull();
      expect((r.json.rows as unknown[]).length).toBe(3);
    }
  });
});

describe('POST /api/bench-check never returns null figures', () => {
  it('a 1e308 V supply is a 400 naming supply.volts (was a 200 with null figures)', async () => {
    const r = await post('/api/bench-check', buckSpec({ supply: { volts: 1e308 } }));
    expect(r.status, r.text).toBe(400);
    expect(fieldsOf(r.json)).toContain('supply.volts');
  });

  it.each([
    ['supply.maxAmps', buckSpec({ supply: { maxAmps: 1e308 } })],
    ['driver.outputAmps', buckSpec({ driver: { outputAmps: 1e308 } })],
    ['driver.switchingHz', buckSpec({ driver: { inductorHenries: 1e-4, switchingHz: 1e-310 } })],
    ['string.count', buckSpec({ count: 2 ** 53 })],
    ['driver.ohms', resistorSpec({ driver: { ohms: 1e-310 } })],
    ['string.led.vfMax', linearSpec({ led: { vfMax: 1e308 } })],
  ])('an extreme %s is a 400 naming it', async (field, spec) => {
    const r = await post('/api/bench-check', spec);
    expect(r.status, r.text).toBe(400);
    expect(fieldsOf(r.json)).toContain(field);
  });

  it('an unknown key anywhere is a 400 naming it by its full path', async () => {
    const spec = buckSpec();
    const r = await post('/api/bench-check', { ...spec, supply: { ...spec.supply, type: 'ac' } });
    expect(r.status, r.text).toBe(400);
    expect(fieldsOf(r.json)).toEqual(['supply.type']);
  });

  it.each([
    ['buck at the top of every range', buckSpec({ supply: { volts: 60, tolerancePct: 0, maxAmps: 100 }, driver: { maxInputVolts: 1000, outputAmps: 100, inductorHenries: 1e-7, switchingHz: 1e3 }, count: 200, wiring: { lengthMeters: 1000, awg: 40 } })],
    ['resistor at the bottom of every range', resistorSpec({ supply: { volts: 1e-9 }, driver: { ohms: 0.01, watts: 1e-9 }, led: { vfMin: 1e-9, vfTyp: 1e-9, vfMax: 1e-9, maxAmps: 1e-9, maxWatts: 1e-9 } })],
    ['a buck set to 5e-324 A (inside the bounds: accepted)', buckSpec({ driver: { outputAmps: 5e-324, inductorHenries: 1e-7, switchingHz: 1e3 } })],
    ['linear with 1000 V across it', linearSpec({ supply: { volts: 1000, tolerancePct: 50, maxAmps: 100 }, driver: { maxInputVolts: 1000, outputAmps: 100 } })],
  ])('%s: a 2xx has only finite figures, a 4xx names a field', async (_what, spec) => {
    const r = await post('/api/bench-check', spec);
    expect(r.status, r.text).toBeLessThan(500);
    if (r.status === 200) expect(firstNonFinite(r.json), r.text).toBeNull();
    else expect(fieldsOf(r.json).length, r.text).toBeGreaterThan(0);
  });

  it('a body that is not a JSON object names (body)', async () => {
    for (const body of ['', '{"supply":', '[]', '"text"', 'null']) {
      const r = await post('/api/bench-check', body);
      expect(r.status, `${body}: ${r.text}`).toBe(400);
      expect(fieldsOf(r.json)).toContain('(body)');
    }
  });
});
