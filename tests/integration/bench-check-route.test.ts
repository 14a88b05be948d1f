// POST /api/bench-check (and /compare) through real HTTP against the production build that
// scripts/test.sh starts (TEST_BASE_URL). Public routes: no session cookie is sent.
import fc from 'fast-check';
import { beforeAll, describe, expect, it } from 'vitest';
import { checkKit } from '@/lib/electrical';
import { malformedBodyArb } from '../unit/electrical/arbitraries';
import { buckSpec, linearSpec, resistorSpec } from '../unit/electrical/fixtures';

let base: string;
beforeAll(() => {
  const url = process.env.TEST_BASE_URL;
  if (!url) throw new Error('TEST_BASE_URL is not set: run through scripts/test.sh, which starts the app');
  base = url;
});

const post = (path: string, body: string) =>
  fetch(base + path, { method: 'POST', headers: { 'content-type': 'application/json' }, body, redirect: 'manual' });

describe('POST /api/bench-check', () => {
  it.each([
    ['buck, with ripple, PWM and a wire run', buckSpec({ driver: { inductorHenries: 68e-6, switchingHz: 300e3 }, pwmDuty: 0.6, wiring: { lengthMeters: 3, awg: 22 } })],
    ['linear, too hot', linearSpec({ driver: { maxWatts: 2 } })],
    ['resistor, supply too low', resistorSpec({ supply: { volts: 9 } })],
  ])('%s: the same report as checkKit, without signing in', async (_name, spec) => {
    const res = await post('/api/bench-check', JSON.stringify(spec));
    expect(res.status).toBe(200);
    expect(res.headers.get('content-type')).toMatch(/application\/json/);
    const { cautions, ...report } = await res.json();
    expect(report).toEqual(JSON.parse(JSON.stringify(checkKit(spec))));
    expect(Object.keys(report).sort()).toEqual(['checks', 'figures', 'verdict']);
    for (const c of report.checks) expect(Object.keys(c).sort()).toEqual(['id', 'limit', 'message', 'unit', 'value', 'verdict']);
    expect(cautions.map((c: { id: string }) => c.id)).toEqual(expect.arrayContaining(['mains', 'polarity', 'fixed-wiring']));
  });

  it('fills the contract defaults for a minimal body', async () => {
    const res = await post(
      '/api/bench-check',
      JSON.stringify({
        supply: { volts: 24, maxAmps: 2 },
        driver: { type: 'buck', minInputVolts: 6, maxInputVolts: 36, outputAmps: 0.35 },
        string: { count: 6, led: { vfMin: 2.8, vfTyp: 3.0, vfMax: 3.4, maxAmps: 0.7, maxWatts: 3 } },
      }),
    );
    expect(res.status).toBe(200);
    const report = await res.json();
    // 5 % tolerance: high end 25.2 V; η 0.90: duty 20.4 / (22.8 × 0.9)
    expect(report.checks.find((c: { id: string }) => c.id === 'supply-vs-driver-max').value).toBeCloseTo(25.2, 9);
    expect(report.figures.duty).toBeCloseTo(20.4 / (22.8 * 0.9), 9);
    expect(report.verdict).toBe('caution');
  });

  it('50 malformed bodies: every one a 400 naming the field, never a 500', async () => {
    const cases = fc.sample(malformedBodyArb(), { numRuns: 50, seed: 20_240_611 });
    expect(cases).toHaveLength(50);
    const failures: string[] = [];
    for (const { body, field, what } of cases) {
      const res = await post('/api/bench-check', body);
      const json = await res.json().catch(() => null);
      const fields = json?.error?.fields ? Object.keys(json.error.fields) : [];
      if (res.status !== 400 || json?.error?.code !== 'invalid' || !fields.includes(field))
        failures.push(`${what}: ${res.status} ${JSON.stringify(json?.error ?? json)}`);
      expect(res.status).toBeLessThan(500);
    }
    expect(failures).toEqual([]);
  });

  it('answers only POST', async () => {
    const res = await fetch(base + '/api/bench-check', { redirect: 'manual' });
    expect(res.status).toBe(405);
  });
});

describe('POST /api/bench-check/compare', () => {
  it('buck, linear and resistor side by side', async () => {
    const spec = buckSpec();
    const res = await post('/api/bench-check/compare', JSON.stringify({ string: spec.string, supply: spec.supply, amps: 0.35 }));
    expect(res.status).toBe(200);
    const { rows } = await res.json();
    expect(rows.map((r: { type: string }) => r.type)).toEqual(['buck', 'linear', 'resistor']);
    expect(rows[0].heatWatts).toBeLessThan(rows[1].heatWatts);
  });

  it('names a bad field', async () => {
    const res = await post('/api/bench-check/compare', JSON.stringify({ string: buckSpec().string, supply: { volts: 'twelve', maxAmps: 1 } }));
    expect(res.status).toBe(400);
    expect(Object.keys((await res.json()).error.fields)).toContain('supply.volts');
  });
});
