import { readdirSync, readFileSync, statSync } from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Role } from '@/db/types';
import { HttpSession } from '../helpers/http';
import { closeTestDb, makeSpace, makeUser, testDb } from '../helpers/db';
import { apiRoutes, concrete } from '../helpers/routes';

// Every route handler × anonymous, member, steward, treasurer, admin. Callers live in a fresh space, so
// lists are empty and unknown ids answer 404 — a reached handler is told apart from a refused one.
// A route on disk without a row here fails the first test.

type Who = 'public' | 'user' | Role[];
type Row = { who: Who; ok: number | number[]; path?: string; body?: unknown };
const W: Role[] = ['steward', 'admin'];
const T: Role[] = ['treasurer'];
const A: Role[] = ['admin'];
const MS: Role[] = ['member', 'steward'];
const EMPTY = {};

export const MATRIX: Record<string, Row> = {
  'GET /api/auth/[...nextauth]': { who: 'public', ok: 200, path: '/api/auth/session' },
  // next-auth takes only its own forms: a post without the form type is a 415 (finding 7).
  'POST /api/auth/[...nextauth]': { who: 'public', ok: [302, 400, 403, 415], path: '/api/auth/signout' },
  'GET /api/attachments/[id]': { who: 'user', ok: 404 },
  'DELETE /api/attachments/[id]': { who: W, ok: 404 },
  'POST /api/attachments': { who: W, ok: 415, body: EMPTY }, // an upload takes multipart, not JSON
  'POST /api/bench-check': { who: 'public', ok: 400, body: EMPTY },
  'POST /api/bench-check/compare': { who: 'public', ok: 400, body: EMPTY },
  // Bench-build only (route.benchonly.ts): not in the test build at all.
  'POST /api/bench-floor/loans': { who: 'public', ok: 404, body: EMPTY },
  'GET /api/bench-floor/scan/[code]': { who: 'public', ok: 404 },
  'GET /api/openapi.json': { who: 'user', ok: 200 },
  'GET /api/books/export': { who: T, ok: 200, path: '/api/books/export?month=2026-11' },
  'POST /api/books/periods': { who: T, ok: 400, body: EMPTY },
  'GET /api/books/reconciliation': { who: T, ok: 200, path: '/api/books/reconciliation?month=2026-11' },
  'POST /api/books/sweep': { who: T, ok: 200 },
  'POST /api/books/resolutions': { who: T, ok: 400, body: EMPTY },
  'GET /api/books/spend': { who: ['treasurer', 'admin'], ok: 200, path: '/api/books/spend?month=2026-11' },
  'GET /api/calendar/[token]': { who: 'public', ok: 404 },
  'GET /api/calendar/link': { who: 'user', ok: 200 },
  'POST /api/calendar/link': { who: 'user', ok: 200 },
  'DELETE /api/holds/[id]': { who: 'user', ok: 404 },
  'GET /api/holds': { who: 'user', ok: 200 },
  'POST /api/holds': { who: 'user', ok: 400, body: EMPTY },
  'DELETE /api/invitations/[id]': { who: A, ok: 404 },
  'POST /api/invitations/accept': { who: 'public', ok: 400, body: EMPTY },
  'GET /api/invitations': { who: A, ok: 200 },
  'POST /api/invitations': { who: A, ok: 400, body: EMPTY },
  'POST /api/kits/boxes/[id]/refill': { who: W, ok: [400, 404], body: EMPTY },
  'POST /api/kits/boxes/[id]/contents': { who: W, ok: [400, 404], body: EMPTY },
  'POST /api/kits/boxes/[id]/take-apart': { who: W, ok: [400, 404], body: EMPTY },
  'GET /api/kits/boxes/[id]': { who: 'user', ok: 404 },
  'GET /api/kits/boxes': { who: 'user', ok: 200 },
  'POST /api/kits/boxes': { who: W, ok: 400, body: EMPTY },
  'GET /api/kits/templates/[id]': { who: 'user', ok: 404 },
  'PUT /api/kits/templates/[id]': { who: W, ok: [400, 404], body: EMPTY },
  'GET /api/kits/templates': { who: 'user', ok: 200 },
  'POST /api/kits/templates': { who: W, ok: 400, body: EMPTY },
  'POST /api/labels': { who: W, ok: 400, body: EMPTY },
  'POST /api/loans/[id]/renew': { who: 'user', ok: 404 },
  'POST /api/loans/[id]/return': { who: 'user', ok: [400, 404], body: EMPTY },
  'GET /api/loans/[id]': { who: 'user', ok: 404 },
  'POST /api/loans/preview': { who: 'user', ok: 400, body: EMPTY },
  'GET /api/loans': { who: 'user', ok: 200 },
  'POST /api/loans': { who: 'user', ok: 400, body: EMPTY },
  'GET /api/locations/[id]': { who: 'user', ok: 404 },
  'PATCH /api/locations/[id]': { who: W, ok: [400, 404], body: EMPTY },
  'DELETE /api/locations/[id]': { who: W, ok: 404 },
  'GET /api/locations': { who: 'user', ok: 200 },
  'POST /api/locations': { who: W, ok: 400, body: EMPTY },
  'GET /api/parts/[id]': { who: 'user', ok: 404 },
  'PATCH /api/parts/[id]': { who: W, ok: [400, 404], body: { name: '' } },
  'POST /api/parts/[id]/units': { who: W, ok: [400, 404], body: { count: -1 } },
  'GET /api/parts/export': { who: 'user', ok: 200 },
  'POST /api/parts/import': { who: W, ok: 400, body: EMPTY },
  'GET /api/parts': { who: 'user', ok: 200 },
  'POST /api/parts': { who: W, ok: 400, body: EMPTY },
  'POST /api/payments/test-endpoint': { who: 'public', ok: 400, body: EMPTY },
  'POST /api/payments/webhook': { who: 'public', ok: 400, body: EMPTY },
  'PATCH /api/people/[id]': { who: A, ok: [400, 404], body: { roles: 'nobody' } },
  'GET /api/people': { who: A, ok: 200 },
  'POST /api/reminders': { who: W, ok: 400, body: EMPTY },
  'POST /api/sales/[id]/cancel': { who: MS, ok: 404 },
  'POST /api/sales/[id]/refunds': { who: T, ok: [400, 404], body: EMPTY },
  'POST /api/sales/[id]/settle': { who: 'user', ok: 404 },
  'GET /api/sales/[id]': { who: 'user', ok: 404 },
  'POST /api/sales/cash': { who: ['steward'], ok: 400, body: EMPTY },
  'POST /api/sales/honour-box': { who: MS, ok: 400, body: EMPTY },
  'GET /api/honour-box': { who: ['steward', 'admin', 'treasurer'], ok: 200 },
  'POST /api/honour-box/counts': { who: W, ok: 400, body: { countedMinor: -1 } },
  'POST /api/honour-box/bankings': { who: W, ok: 400, body: EMPTY },
  'GET /api/sales/catalog': { who: MS, ok: 200 },
  'POST /api/sales': { who: MS, ok: 400, body: EMPTY },
  'GET /api/scan/[code]': { who: 'user', ok: 404 },
  'POST /api/scan': { who: 'user', ok: 400, body: EMPTY },
  'GET /api/settings': { who: A, ok: 200 },
  'PATCH /api/settings': { who: A, ok: 400, body: { loanDays: -1 } },
  'POST /api/sign-in-link': { who: 'public', ok: 400, body: EMPTY },
  // Running it for a space (issue 15): spaces exist in the test run, so the first run is closed.
  'POST /api/first-run': { who: 'public', ok: [400, 404], body: EMPTY },
  'GET /api/health': { who: 'public', ok: [200, 503] },
  'GET /api/export': { who: A, ok: 200 },
  'POST /api/people/[id]/erase': { who: A, ok: [400, 404], body: EMPTY },
  'POST /api/stock/adjust': { who: W, ok: 400, body: EMPTY },
  'POST /api/stock/counts/[id]/post': { who: W, ok: 404 },
  'GET /api/stock/counts/[id]': { who: 'user', ok: 404 },
  'PATCH /api/stock/counts/[id]': { who: W, ok: [400, 404], body: EMPTY },
  'DELETE /api/stock/counts/[id]': { who: W, ok: 404 },
  'GET /api/stock/counts': { who: 'user', ok: 200 },
  'POST /api/stock/counts': { who: W, ok: 400, body: EMPTY },
  'POST /api/stock/move': { who: W, ok: 400, body: EMPTY },
  'POST /api/stock/receive': { who: W, ok: 400, body: EMPTY },
  'GET /api/stock/repairs': { who: 'user', ok: 200 },
  'PATCH /api/stock/units/[id]': { who: W, ok: [400, 404], body: EMPTY },
  'POST /api/test/clock': { who: 'public', ok: 400, body: EMPTY },
  // Borrowing rules (issue 16)
  'GET /api/settings/borrowing': { who: A, ok: 200 },
  'PATCH /api/settings/borrowing': { who: A, ok: 400, body: { reminderPauseHours: 0 } },
  'GET /api/settings/money': { who: A, ok: 200 },
  'PATCH /api/settings/money': { who: A, ok: 400, body: { taxRateBp: -1 } },
  'GET /api/inductions': { who: 'user', ok: 200 },
  'POST /api/inductions': { who: W, ok: 400, body: EMPTY },
  'PATCH /api/inductions/[id]': { who: W, ok: [400, 404], body: EMPTY },
  'POST /api/inductions/[id]/signoffs': { who: W, ok: [400, 404], body: EMPTY },
  'GET /api/signoffs': { who: 'user', ok: 200 },
  'DELETE /api/signoffs/[id]': { who: W, ok: 404 },
  'POST /api/loans/[id]/hand-over': { who: W, ok: 404 },
  // Deposits and charges (issue 16)
  'POST /api/loans/[id]/cancel': { who: 'user', ok: 404 },
  'POST /api/loans/[id]/deposit-release': { who: W, ok: 404 },
  'POST /api/people/[id]/settle-charges': { who: W, ok: [400, 404], body: EMPTY },
  'POST /api/people/[id]/pay-charges': { who: 'user', ok: 404, body: EMPTY },
  // Restocking (issue 13): suppliers, prices and orders are for stewards and admins only; admins set the
  // budget and approve overruns.
  'GET /api/suppliers': { who: W, ok: 200 },
  'POST /api/suppliers': { who: W, ok: 400, body: EMPTY },
  'PATCH /api/suppliers/[id]': { who: W, ok: [400, 404], body: { leadDays: -1 } },
  'POST /api/suppliers/offers': { who: W, ok: 400, body: EMPTY },
  'DELETE /api/suppliers/offers/[id]': { who: W, ok: 404 },
  'GET /api/suppliers/offers/export': { who: W, ok: 200 },
  'POST /api/suppliers/offers/import': { who: W, ok: 400, body: EMPTY },
  'GET /api/orders': { who: W, ok: 200 },
  'POST /api/orders': { who: W, ok: 400, body: EMPTY },
  'GET /api/orders/to-order': { who: W, ok: 200 },
  'GET /api/orders/[id]': { who: W, ok: 404 },
  'PATCH /api/orders/[id]': { who: W, ok: [400, 404], body: { lines: [] } },
  'POST /api/orders/[id]/send': { who: W, ok: 404, body: EMPTY },
  'POST /api/orders/[id]/receive': { who: W, ok: [400, 404], body: EMPTY },
  'POST /api/orders/[id]/cancel': { who: W, ok: [400, 404], body: EMPTY },
  'POST /api/orders/[id]/approve': { who: A, ok: [400, 404], body: EMPTY },
  'GET /api/orders/[id]/pdf': { who: W, ok: 404 },
  'GET /api/settings/restocking': { who: A, ok: 200 },
  'PATCH /api/settings/restocking': { who: A, ok: 400, body: EMPTY },
};

const ROLES: Role[] = ['member', 'steward', 'treasurer', 'admin'];
const sessions: Partial<Record<Role | 'anonymous', HttpSession>> = {};

function expected(row: Row, caller: Role | 'anonymous'): number[] {
  const ok = Array.isArray(row.ok) ? row.ok : [row.ok];
  if (row.who === 'public') return ok;
  if (caller === 'anonymous') return [401];
  if (row.who === 'user') return ok;
  return row.who.includes(caller) ? ok : [403];
}

describe('authorization matrix', () => {
  beforeAll(async () => {
    const db = testDb();
    const space = await makeSpace(db, { name: 'Matrix space' });
    sessions.anonymous = new HttpSession();
    for (const role of ROLES) {
      const u = await makeUser(db, space.id, [role], `Matrix ${role}`);
      const s = new HttpSession();
      await s.signIn(u.email, u.password);
      expect(await s.isSignedIn()).toBe(true);
      sessions[role] = s;
    }
  });
  afterAll(closeTestDb);

  it('has a row for every route handler on disk, and no row for a route that is gone', () => {
    const onDisk = apiRoutes().flatMap((r) => r.methods.map((m) => `${m} ${r.pattern}`));
    expect(onDisk.filter((k) => !(k in MATRIX))).toEqual([]);
    expect(Object.keys(MATRIX).filter((k) => !onDisk.includes(k))).toEqual([]);
  });

  for (const [key, row] of Object.entries(MATRIX)) {
    it(key, async () => {
      const [method, pattern] = key.split(' ');
      const target = row.path ?? concrete(pattern);
      const got: Record<string, number> = {};
      const want: Record<string, number[]> = {};
      for (const caller of ['anonymous', ...ROLES] as const) {
        const res = await sessions[caller]!.fetch(target, {
          method,
          headers: row.body === undefined ? {} : { 'content-type': 'application/json' },
          body: row.body === undefined ? undefined : JSON.stringify(row.body),
        });
        await res.arrayBuffer();
        got[caller] = res.status;
        want[caller] = expected(row, caller);
      }
      const mismatches = Object.keys(got).filter((c) => !want[c].includes(got[c]));
      expect(mismatches.map((c) => `${c}: got ${got[c]}, want ${want[c].join('|')}`)).toEqual([]);
    });
  }
});

describe('server actions', () => {
  // Server actions are public endpoints too: each exported action must check the person first.
  function files(dir: string): string[] {
    return readdirSync(dir).flatMap((n) => {
      const full = path.join(dir, n);
      if (statSync(full).isDirectory()) return n === 'node_modules' ? [] : files(full);
      return /\.(ts|tsx)$/.test(n) ? [full] : [];
    });
  }
  const root = path.resolve(__dirname, '../..');
  const actionFiles = ['app', 'components', 'lib']
    .flatMap((d) => files(path.join(root, d)))
    .filter((f) => /^\s*['"]use server['"]/m.test(readFileSync(f, 'utf8')));

  it('exist in the project (the check below is not vacuous)', () => {
    expect(actionFiles.length).toBeGreaterThan(0);
  });

  for (const file of actionFiles) {
    it(`${path.relative(root, file)}: every exported action checks the role on the server`, () => {
      const src = readFileSync(file, 'utf8');
      const exported = [...src.matchAll(/export\s+(?:async\s+function|const)\s+(\w+)/g)].map((m) => m[1]);
      expect(exported.length).toBeGreaterThan(0);
      for (const name of exported) {
        const start = src.indexOf(name);
        const next = src.indexOf('\nexport ', start + 1);
        const body = src.slice(start, next === -1 ? undefined : next);
        expect(body, `${name} must be built with action() or formAction() (lib/auth/action.ts)`).toMatch(
          /\b(?:action|formAction)\(/,
        );
      }
    });
  }
});
