import { generateSync } from 'json-schema-faker';
import { z } from 'zod';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ROUTES } from '@/app/api/_declared/routes';
import { declaredMethods } from '@/lib/http/openapi';
import { HttpSession } from '../helpers/http';
import { closeTestDb, makeSpace, makeUser, testDb } from '../helpers/db';

// The API document tells the truth about bodies: examples generated from each route's published JSON
// Schema (the same zod → JSON Schema conversion /api/openapi.json uses) by an independent generator
// (json-schema-faker) are accepted by the route's own validation. A rule JSON Schema cannot express (one
// field against another) may refuse an example only when the document states that rule in words — its
// message appears in a `description` of the body schema. Every route must accept some of its examples.
// Then the accepted ones go to the running app: valid-shaped bodies reach the services, which may refuse
// them (unknown ids, stock) but never with a 5xx. Fuzzed, invalid bodies are fuzz-json-routes.test.ts.

const SEEDS = 12;
const SENT_PER_ROUTE = 3;
const SKIP = new Set(['POST /api/test/clock', 'POST /api/payments/test-endpoint']); // test hooks, not in the app's API

type Issue = { path: PropertyKey[]; message: string };
const toPath = (p: string) => p.replace(/\{(\w+)\}/g, '[$1]');

function descriptions(schema: unknown, out: string[] = []): string[] {
  if (Array.isArray(schema)) for (const s of schema) descriptions(s, out);
  else if (schema && typeof schema === 'object')
    for (const [k, v] of Object.entries(schema)) {
      if (k === 'description' && typeof v === 'string') out.push(v.toLowerCase());
      else descriptions(v, out);
    }
  return out;
}

const bodies = Object.entries(ROUTES).flatMap(([path, mod]) =>
  declaredMethods(mod).flatMap(({ method, spec }) => {
    if (spec.body?.kind !== 'json' || SKIP.has(`${method} ${path}`)) return [];
    const documented = spec.body.doc ?? spec.body.schema;
    const jsonSchema = z.toJSONSchema(documented, { io: 'input', unrepresentable: 'any', target: 'draft-2020-12' });
    return [{ key: `${method} ${path}`, method, path, documented, jsonSchema: clampLengths(jsonSchema), rules: descriptions(jsonSchema) }];
  }),
);

/** The generator writes a string's full maxLength before cutting it (seconds for a 2 MB field): clamp it first. */
function clampLengths(schema: unknown): unknown {
  if (Array.isArray(schema)) return schema.map(clampLengths);
  if (!schema || typeof schema !== 'object') return schema;
  const out: Record<string, unknown> = {};
  for (const [k, v] of Object.entries(schema)) out[k] = k === 'maxLength' && typeof v === 'number' ? Math.min(v, 200) : clampLengths(v);
  return out;
}

const isDocumented = (rules: string[], issue: Issue) => rules.some((d) => d.includes(issue.message.toLowerCase()));

let session: HttpSession;
beforeAll(async () => {
  const db = testDb();
  const space = await makeSpace(db, { name: 'Examples space' });
  const user = await makeUser(db, space.id, ['member', 'steward', 'treasurer', 'admin'], 'Examples person');
  session = new HttpSession();
  await session.signIn(user.email, user.password);
  expect(await session.isSignedIn()).toBe(true);
});
afterAll(closeTestDb);

describe('examples generated from the published body schemas', () => {
  it('covers the JSON routes', () => {
    expect(bodies.length).toBeGreaterThan(20);
    expect(bodies.map((b) => b.key)).toContain('POST /api/bench-check');
  });

  for (const b of bodies) {
    it(`${b.key}: accepted, or refused only by a rule the document states`, { timeout: 60_000 }, async () => {
      const accepted: unknown[] = [];
      const undocumented: string[] = [];
      for (let seed = 1; seed <= SEEDS; seed++) {
        const example = generateSync(b.jsonSchema as never, { seed, optionalsProbability: 0.5 });
        const parsed = b.documented.safeParse(example);
        if (parsed.success) accepted.push(example);
        else
          for (const issue of parsed.error.issues)
            if (!isDocumented(b.rules, issue)) undocumented.push(`${issue.path.join('.')}: ${issue.message} ← ${JSON.stringify(example).slice(0, 300)}`);
      }
      expect(undocumented, 'refused for a rule the document does not state').toEqual([]);
      expect(accepted.length, 'no generated example was accepted').toBeGreaterThan(0);

      for (const example of accepted.slice(0, SENT_PER_ROUTE)) {
        const path = toPath(b.path).replace(/\[(\w+)\]/g, (_, n: string) => (n === 'id' ? '00000000-0000-4000-8000-000000000000' : '0000000'));
        const res = await session.fetch(path, { method: b.method, headers: { 'content-type': 'application/json' }, body: JSON.stringify(example) });
        const text = await res.text();
        expect(res.status, `${b.key} ${JSON.stringify(example).slice(0, 300)} → ${text.slice(0, 300)}`).toBeLessThan(500);
        expect(res.status).not.toBe(415);
        if (res.status === 400) {
          // A 400 on a body the schema accepted comes from a service rule, which names its field too.
          const body = JSON.parse(text) as { error: { fields?: Record<string, string[]> } };
          expect(Object.keys(body.error.fields ?? {}).length, text).toBeGreaterThan(0);
        }
      }
    });
  }
});
