import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { closeTestDb, makePart, testDb } from '../helpers/db';
import type { HttpSession } from '../helpers/http';
import { chainParts, json, loanSpace, login, makeStock, makeUnit, supplySpecs, type ErrorBody } from './loans-fixtures';

// A steward lending loose parts to a member previews the member's build, not their own: the preview
// takes `borrowerId` from stewards and admins only. Real HTTP to the production build, real PostgreSQL.
//
// The verdict leans on one rule far from its threshold: a 48 V ±5 % supply (45.6–50.4 V) is above the
// buck driver's 36 V maximum input (the check's input-range rule), so that chain fails whatever the LEDs.

const db = testDb();
let fx: Awaited<ReturnType<typeof loanSpace>>;
let other: Awaited<ReturnType<typeof loanSpace>>;
let parts: Awaited<ReturnType<typeof chainParts>>;
let steward: HttpSession;
let members: HttpSession[];
let ledLine: { partId: string; locationId: string; qty: number };

type PreviewBody = {
  preview: {
    gate: string;
    openLoans: number;
    outcome: { kind: string; verdict: string | null; build?: { held: string[] } };
  };
};

beforeAll(async () => {
  fx = await loanSpace(db, { members: 2 });
  other = await loanSpace(db, { members: 1 });
  parts = await chainParts(db, fx.space.id);
  const supply48 = await makePart(db, fx.space.id, {
    name: '48 V 1.5 A test supply',
    category: 'supply',
    tracking: 'unit',
    specs: supplySpecs(48, 1.5),
  });
  steward = await login(fx.steward);
  members = await Promise.all(fx.members.map(login));
  // Member 1 already has a 48 V supply and a 36 V-max driver out.
  const supply = await makeUnit(db, fx.space.id, supply48.id, fx.bin.id);
  const driver = await makeUnit(db, fx.space.id, parts.driver.id, fx.bin.id);
  expect((await members[0].post('/api/loans', { unitIds: [supply.id, driver.id] })).status).toBe(201);
  await makeStock(db, fx.space.id, parts.led.id, fx.bin.id, 10);
  ledLine = { partId: parts.led.id, locationId: fx.bin.id, qty: 3 };
});
afterAll(closeTestDb);

describe('a steward previews loose parts for the member they lend to', () => {
  test("the preview checks the borrower's whole build, not the steward's", async () => {
    const res = await steward.post('/api/loans/preview', { counted: [ledLine], borrowerId: fx.members[0].id });
    expect(res.status).toBe(200);
    const { preview } = await json<PreviewBody>(res);
    expect(preview.outcome).toMatchObject({ kind: 'checked', verdict: 'fail' });
    expect(preview.gate).toBe('blocked');
    expect(preview.outcome.build?.held).toEqual(
      expect.arrayContaining(['48 V 1.5 A test supply', '350 mA test buck driver']),
    );
    expect(preview.openLoans).toBe(1);

    // The steward's own build has none of it: three LEDs alone are not a chain yet.
    const own = await json<PreviewBody>(await steward.post('/api/loans/preview', { counted: [ledLine] }));
    expect(own.preview.outcome.kind).toBe('incomplete');
    expect(own.preview.openLoans).toBe(0);
  });

  test("a member cannot preview someone else's build", async () => {
    const res = await members[1].post('/api/loans/preview', { counted: [ledLine], borrowerId: fx.members[0].id });
    expect(res.status).toBe(403);
    // Naming themselves is allowed, and is their own build.
    const self = await members[1].post('/api/loans/preview', { counted: [ledLine], borrowerId: fx.members[1].id });
    expect(self.status).toBe(200);
    expect((await json<PreviewBody>(self)).preview.outcome.kind).toBe('incomplete');
  });

  test('a person of another space is not found, and a malformed id is named', async () => {
    const foreign = await steward.post('/api/loans/preview', { counted: [ledLine], borrowerId: other.members[0].id });
    expect(foreign.status).toBe(404);
    const bad = await steward.post('/api/loans/preview', { counted: [ledLine], borrowerId: 'not-an-id' });
    expect(bad.status).toBe(400);
    expect((await json<ErrorBody>(bad)).error.fields).toHaveProperty('borrowerId');
  });
});
