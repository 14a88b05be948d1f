import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { closeTestDb, makeLocation, makePart, makeSpace, makeStock, makeUnit, makeUser, testDb } from '../helpers/db';
import type { HttpSession } from '../helpers/http';
import { json, login, type ErrorBody } from './loans-fixtures';

// Kits use what is in the box: the heat sinks' °C/W and count from the shelf, the LEDs' thermal specs,
// and the space's air temperature (a setting). Real HTTP to the production build, real PostgreSQL.
//
// The numbers follow the check's LED junction rule (lib/electrical/README.md, rule 7): heat per LED
// P_h = vfMax × I (all electrical power counted as heat), T_sink = ambient + N·P_h/count × R_sink,
// T_j = T_sink + P_h × (R_js + 2 °C/W board) — the series thermal-resistance model of any heat-transfer
// textbook; the 2 °C/W board figure is from memory. Caution above T_j,max − 25 °C (common practice
// (no source)), fail above T_j,max.
//
// Kit: 4 LEDs (Vf max 3.6 V, R_js 9 °C/W, T_j,max 125 °C) at 0.5 A on one sink of 9 °C/W, 25 °C:
//   P_h = 1.8 W; T_sink = 25 + 7.2 × 9 = 89.8 °C; T_j = 89.8 + 1.8 × 11 = 109.6 °C → caution (> 100).
//   The largest sink that keeps T_j ≤ 100 °C: (100 − 25 − 19.8) / 7.2 = 7.667 °C/W.
// Every other check is far from its limit (string ≤ 14.4 V on a 22.8–25.2 V supply, 60 % of the
// LED's power rating, 0.35 A of a 2 A supply).

const db = testDb();
let admin: HttpSession;
let steward: HttpSession;
let member: HttpSession;
let spaceId: string;
let weakBoxId: string;
let twoSinkBoxId: string;

type BoxCheck = {
  check: {
    verdict: string;
    outcome: {
      kind: string;
      chain: { heatSink?: string };
      report: {
        verdict: string;
        checks: { id: string; verdict: string; message: string }[];
        figures: { ledJunctionC?: number; sinkC?: number; sinkCPerWNeeded?: number };
      };
    };
  };
};

beforeAll(async () => {
  const space = await makeSpace(db);
  spaceId = space.id;
  const bin = await makeLocation(db, spaceId);
  const supply = await makePart(db, spaceId, {
    name: '24 V 2 A thermal-test supply',
    category: 'supply',
    tracking: 'unit',
    specs: { volts: 24, tolerancePct: 5, maxAmps: 2 },
  });
  const driver = await makePart(db, spaceId, {
    name: '500 mA thermal-test buck',
    category: 'driver',
    tracking: 'unit',
    specs: { type: 'buck', minInputVolts: 5, maxInputVolts: 28, outputAmps: 0.5 },
  });
  const led = await makePart(db, spaceId, {
    name: 'Thermal-test warm LED',
    category: 'led',
    tracking: 'counted',
    specs: { vfMin: 2.9, vfTyp: 3.2, vfMax: 3.6, maxAmps: 0.7, maxWatts: 3, thermalOhmsJs: 9, maxJunctionC: 125 },
  });
  const weakSink = await makePart(db, spaceId, {
    name: 'Small round sink',
    category: 'heat_sink',
    tracking: 'counted',
    specs: { celsiusPerWatt: 9 },
  });
  for (const p of [led, weakSink]) await makeStock(db, spaceId, p.id, bin.id, 40);
  for (let i = 0; i < 2; i++) {
    await makeUnit(db, spaceId, supply.id, bin.id);
    await makeUnit(db, spaceId, driver.id, bin.id);
  }
  admin = await login(await makeUser(db, spaceId, ['admin']));
  steward = await login(await makeUser(db, spaceId, ['steward']));
  member = await login(await makeUser(db, spaceId, ['member']));

  const boxWith = async (sinks: number) => {
    const t = await steward.post('/api/kits/templates', {
      name: `Shelf light, ${sinks} sink${sinks > 1 ? 's' : ''}`,
      lines: [
        { partId: supply.id, qty: 1, chainRole: 'supply' },
        { partId: driver.id, qty: 1, chainRole: 'driver' },
        { partId: led.id, qty: 4, chainRole: 'led' },
        { partId: weakSink.id, qty: sinks, chainRole: null },
      ],
    });
    expect(t.status).toBe(201);
    const { template } = await json<{ template: { id: string } }>(t);
    const b = await steward.post('/api/kits/boxes', { templateId: template.id });
    expect(b.status).toBe(201);
    return (await json<{ box: { id: string } }>(b)).box.id;
  };
  weakBoxId = await boxWith(1);
  twoSinkBoxId = await boxWith(2);
});
afterAll(closeTestDb);

async function boxCheck(id: string) {
  const res = await member.get(`/api/kits/boxes/${id}`);
  expect(res.status).toBe(200);
  return (await json<BoxCheck>(res)).check;
}
async function setAmbient(c: number) {
  const res = await admin.post('/api/settings', { ambientC: c }, 'PATCH');
  expect(res.status).toBe(200);
}

describe('a kit box is checked on its own heat sinks', () => {
  test('one weak sink under four LEDs: caution for heat, with the sink that would fix it', async () => {
    const check = await boxCheck(weakBoxId);
    expect(check.verdict).toBe('caution');
    const { report, chain } = check.outcome;
    expect(report.figures.ledJunctionC).toBeCloseTo(109.6, 1);
    expect(report.figures.sinkC).toBeCloseTo(89.8, 1);
    expect(report.figures.sinkCPerWNeeded).toBeCloseTo(7.667, 2);
    // Heat is the only reason, said in words.
    const notOk = report.checks.filter((c) => c.verdict !== 'ok');
    expect(notOk).toHaveLength(1);
    expect(notOk[0].message).toMatch(/°C/);
    expect(chain.heatSink).toBe('1 × Small round sink (9 °C/W each)');
  });

  test('two of the same sinks share the LEDs: the count comes from the box', async () => {
    // T_sink = 25 + (4 × 1.8 / 2) × 9 = 57.4 °C; T_j = 57.4 + 1.8 × 11 = 77.2 °C → ok.
    const check = await boxCheck(twoSinkBoxId);
    expect(check.verdict).toBe('ok');
    expect(check.outcome.report.figures.ledJunctionC).toBeCloseTo(77.2, 1);
  });
});

describe('the space\'s air temperature', () => {
  test('defaults to 25 °C, is bounded −20…60 and changes the verdict', async () => {
    const got = await json<{ settings: { ambientC: number } }>(await admin.get('/api/settings'));
    expect(got.settings.ambientC).toBe(25);

    const tooHot = await admin.post('/api/settings', { ambientC: 61 }, 'PATCH');
    expect(tooHot.status).toBe(400);
    expect((await json<ErrorBody>(tooHot)).error.fields).toHaveProperty('ambientC');
    expect((await admin.post('/api/settings', { ambientC: -21 }, 'PATCH')).status).toBe(400);
    expect((await member.post('/api/settings', { ambientC: 10 }, 'PATCH')).status).toBe(403);

    try {
      // 10 °C: T_j = 94.6 °C, under the 100 °C caution line → ok.
      await setAmbient(10);
      expect((await boxCheck(weakBoxId)).verdict).toBe('ok');
      // 45 °C: T_j = 129.6 °C, over the LED's 125 °C → fail, and the box cannot be borrowed.
      await setAmbient(45);
      const hot = await boxCheck(weakBoxId);
      expect(hot.verdict).toBe('fail');
      expect(hot.outcome.report.figures.ledJunctionC).toBeCloseTo(129.6, 1);
      const res = await member.post('/api/loans', { kitBoxId: weakBoxId, acknowledgeCaution: true });
      expect(res.status).toBe(409);
      const row = await db.selectFrom('spaces').select('ambient_c').where('id', '=', spaceId).executeTakeFirstOrThrow();
      expect(row.ambient_c).toBe(45);
    } finally {
      await setAmbient(25);
    }
  });
});
