// The route handler called in-process with a real Request (the HTTP round trip is in
// tests/integration/bench-check-route.test.ts).
import { describe, expect, it } from 'vitest';
import { POST as compare } from '@/app/api/bench-check/compare/route';
import { POST } from '@/app/api/bench-check/route';
import { checkKit } from '@/lib/electrical';
import { buckSpec } from './fixtures';

const post = (handler: (req: Request) => Promise<Response>, body: string) =>
  handler(new Request('http://local.test/api/bench-check', { method: 'POST', headers: { 'content-type': 'application/json' }, body }));

describe('POST /api/bench-check handler', () => {
  it('answers the same report as checkKit, with the cautions alongside', async () => {
    const spec = buckSpec({ supply: { volts: 15, tolerancePct: 5 } });
    const res = await post(POST, JSON.stringify(spec));
    expect(res.status).toBe(200);
    const body = await res.json();
    const { cautions, ...report } = body;
    expect(report).toEqual(JSON.parse(JSON.stringify(checkKit(spec))));
    expect(cautions.map((c: { id: string }) => c.id)).toContain('mains');
  });

  it.each([
    ['not JSON', '{"supply":', '(body)'],
    ['empty', '', '(body)'],
    ['null', 'null', '(body)'],
    ['negative volts', JSON.stringify(buckSpec({ supply: { volts: -1 } })), 'supply.volts'],
    ['zero LEDs', JSON.stringify(buckSpec({ count: 0 })), 'string.count'],
    ['unknown driver', JSON.stringify({ ...buckSpec(), driver: { type: 'boost' } }), 'driver.type'],
    // A field named like an Object.prototype member once crashed the error builder (found by the fuzz test).
    ['a "constructor" key', JSON.stringify({ ...buckSpec(), constructor: 1 }), 'constructor'],
    ['a "__proto__" key', '{"__proto__": {"x": 1}, "supply": {"volts": 12, "maxAmps": 1}}', '__proto__'],
    ['an AC supply', JSON.stringify({ ...buckSpec(), supply: { volts: 230, maxAmps: 1, kind: 'ac' } }), 'supply.kind'],
  ])('%s → 400 naming %s', async (_name, body, field) => {
    const res = await post(POST, body);
    expect(res.status).toBe(400);
    const json = await res.json();
    expect(json.error.code).toBe('invalid');
    expect(Object.keys(json.error.fields)).toContain(field);
  });
});

describe('POST /api/bench-check/compare handler', () => {
  it('compares the three driver types', async () => {
    const spec = buckSpec();
    const res = await post(compare, JSON.stringify({ string: spec.string, supply: spec.supply, amps: 0.35 }));
    expect(res.status).toBe(200);
    const { rows } = await res.json();
    expect(rows.map((r: { type: string }) => r.type)).toEqual(['buck', 'linear', 'resistor']);
  });

  it('a 1e-310 A current is a 400 naming amps, not a 500', async () => {
    const spec = buckSpec();
    const res = await post(compare, JSON.stringify({ string: spec.string, supply: spec.supply, amps: 1e-310 }));
    expect(res.status).toBe(400);
    expect(Object.keys((await res.json()).error.fields)).toEqual(['amps']);
  });

  it('LED ratings so small that the default drive is under 0.1 mA ask for amps', async () => {
    const spec = buckSpec({ led: { maxWatts: 1e-288 } });
    const res = await post(compare, JSON.stringify({ string: spec.string, supply: spec.supply }));
    expect(res.status).toBe(400);
    expect(Object.keys((await res.json()).error.fields)).toEqual(['amps']);
  });

  it('a row with no feasible resistor leaves report out instead of sending null', async () => {
    const spec = buckSpec({ supply: { volts: 12 } }); // 4 × 3.0 V = 12 V: no room for a resistor
    const res = await post(compare, JSON.stringify({ string: spec.string, supply: spec.supply, amps: 0.35 }));
    expect(res.status).toBe(200);
    const { rows } = await res.json();
    expect(rows[2].type).toBe('resistor');
    expect(rows[2].verdict).toBe('fail');
    expect('report' in rows[2]).toBe(false);
  });

  it('names a bad field', async () => {
    const res = await post(compare, JSON.stringify({ string: { count: 2 }, supply: { volts: 12, maxAmps: 1 } }));
    expect(res.status).toBe(400);
    expect(Object.keys((await res.json()).error.fields)).toContain('string.led');
  });
});
