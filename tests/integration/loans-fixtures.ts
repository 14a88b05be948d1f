import type { Db } from '@/db/connect';
import { makeLocation, makePart, makeSpace, makeStock, makeUnit, makeUser } from '../helpers/db';
import { signedIn, type HttpSession } from '../helpers/http';

// Shared set-up for the loans-* integration files (not a test file itself): a space of its own with
// a steward, members, one bin, and the parts of an LED chain with believable (invented) specs.

export type TestUser = Awaited<ReturnType<typeof makeUser>>;

export const LED_SPECS = { vfMin: 2.9, vfTyp: 3.2, vfMax: 3.6, maxAmps: 0.7, maxWatts: 3 };
export const BUCK_350 = { type: 'buck', minInputVolts: 6, maxInputVolts: 36, outputAmps: 0.35 };
export const supplySpecs = (volts: number, maxAmps = 2) => ({ volts, tolerancePct: 5, maxAmps });

export async function loanSpace(db: Db, opts: { timeZone?: string; members?: number } = {}) {
  const space = await makeSpace(db, { timeZone: opts.timeZone ?? 'America/Chicago' });
  const steward = await makeUser(db, space.id, ['steward'], 'Test steward');
  const members: TestUser[] = [];
  for (let i = 0; i < (opts.members ?? 2); i++)
    members.push(await makeUser(db, space.id, ['member'], `Test member ${i + 1}`));
  const bin = await makeLocation(db, space.id);
  return { space, steward, members, bin };
}

export async function chainParts(db: Db, spaceId: string) {
  return {
    supply24: await makePart(db, spaceId, {
      name: '24 V 2 A test supply',
      category: 'supply',
      tracking: 'unit',
      specs: supplySpecs(24),
    }),
    supply12: await makePart(db, spaceId, {
      name: '12 V 2 A test supply',
      category: 'supply',
      tracking: 'unit',
      specs: supplySpecs(12),
    }),
    driver: await makePart(db, spaceId, {
      name: '350 mA test buck driver',
      category: 'driver',
      tracking: 'unit',
      specs: BUCK_350,
    }),
    led: await makePart(db, spaceId, {
      name: 'Test white LED star',
      category: 'led',
      tracking: 'counted',
      specs: LED_SPECS,
    }),
    // Same LED with a low power rating: 3.2 V × 0.35 A = 1.12 W is 75 % of 1.5 W, above the 70 %
    // heat-sink threshold (common practice (no source)) → a caution, every other check far from a limit.
    warmLed: await makePart(db, spaceId, {
      name: 'Test LED, low power rating',
      category: 'led',
      tracking: 'counted',
      specs: { ...LED_SPECS, maxWatts: 1.5 },
    }),
    meter: await makePart(db, spaceId, {
      name: 'Test multimeter',
      category: 'meter',
      tracking: 'unit',
      specs: {},
    }),
  };
}

export { makeStock, makeUnit };

export const login = (u: TestUser): Promise<HttpSession> => signedIn(u.email, u.password);

export async function json<T = Record<string, unknown>>(res: Response): Promise<T> {
  return (await res.json()) as T;
}
export type ErrorBody = { error: { code: string; message: string; fields?: Record<string, string[]> } };
