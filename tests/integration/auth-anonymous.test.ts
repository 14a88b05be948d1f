import { describe, expect, test } from 'vitest';
import { randomUUID } from 'node:crypto';
import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { HttpSession } from '../helpers/http';

// Every route handler under app/api, found on disk at test time (so new routes are covered the day
// they are added), called with no session: a protected one answers 401 before it looks at the body
// or the id; a public one never answers 5xx to a stranger's empty request.

const API = path.resolve(__dirname, '../../app/api');

// Public on purpose, each for its own reason; everything else must want a session.
const PUBLIC: Record<string, string> = {
  'auth/[...nextauth]': "next-auth's own sign-in endpoints",
  'bench-check': 'the compatibility check is for everyone, signed in or not',
  'bench-check/compare': 'the compatibility check is for everyone, signed in or not',
  'sign-in-link': 'asking for a sign-in link',
  'invitations/accept': 'the invitation token is the credential',
  'calendar/[token]': 'the calendar feed token is the credential',
  'payments/webhook': "the processor's signature is the credential",
  'payments/test-endpoint': 'test hook (404 unless OHM_TEST_HOOKS=1)',
  'test/clock': 'test hook (404 unless OHM_TEST_HOOKS=1)',
};

type Route = { dir: string; methods: string[] };

function findRoutes(dir = API): Route[] {
  const found: Route[] = [];
  for (const entry of readdirSync(dir, { withFileTypes: true })) {
    const full = path.join(dir, entry.name);
    if (entry.isDirectory()) found.push(...findRoutes(full));
    else if (entry.name === 'route.ts') {
      const source = readFileSync(full, 'utf8');
      const methods = [
        ...source.matchAll(/export\s+(?:const|async\s+function|function)\s+(GET|POST|PUT|PATCH|DELETE)\b/g),
      ].map((m) => m[1]);
      found.push({ dir: path.relative(API, dir).split(path.sep).join('/'), methods });
    }
  }
  return found.sort((a, b) => a.dir.localeCompare(b.dir));
}

/** A concrete URL for a route folder: each [segment] becomes a random id nobody has. */
const urlFor = (dir: string) => `/api/${dir.replace(/\[[^\]]+\]/g, () => randomUUID())}`;

const routes = findRoutes();
const cases = routes.flatMap((r) =>
  r.methods.map((method) => ({ method, dir: r.dir, isPublic: r.dir in PUBLIC })),
);

function call(method: string, dir: string): Promise<Response> {
  const s = new HttpSession();
  return method === 'GET' ? s.get(urlFor(dir)) : s.post(urlFor(dir), {}, method);
}

describe('route handlers seen by an anonymous caller', () => {
  test('the walk found the routes (including the ones of People and Settings)', () => {
    const dirs = routes.map((r) => r.dir);
    expect(dirs).toEqual(
      expect.arrayContaining(['people', 'people/[id]', 'invitations', 'invitations/[id]', 'settings']),
    );
    expect(cases.length).toBeGreaterThan(10);
  });

  test.each(cases.filter((c) => !c.isPublic))('$method /api/$dir → 401', async ({ method, dir }) => {
    const res = await call(method, dir);
    expect(res.status).toBe(401);
    expect(((await res.json()) as { error: { code: string } }).error.code).toBe('unauthenticated');
  });

  test.each(cases.filter((c) => c.isPublic && c.dir !== 'auth/[...nextauth]'))(
    '$method /api/$dir (public) answers a stranger without a server error',
    async ({ method, dir }) => {
      const res = await call(method, dir);
      expect(res.status).toBeLessThan(500);
    },
  );
});
