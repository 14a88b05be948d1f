import http from 'node:http';
import { Validator } from '@seriousme/openapi-schema-validator';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { BASE, HttpSession } from '../helpers/http';
import { closeTestDb, makeSpace, makeUser, testDb } from '../helpers/db';
import { apiRoutes, concrete, openApiPath } from '../helpers/routes';

// The one route declaration (lib/http/route.ts) over real HTTP: the document it generates, the origin
// check, the content-type rule, one id rule for every [id] route, the CSP on pages, and the dev mailbox
// answering only this machine.

type ErrorBody = { error: { code: string; message: string; fields?: Record<string, string[]> } };
let staff: HttpSession;
let member: HttpSession;

beforeAll(async () => {
  const db = testDb();
  const space = await makeSpace(db, { name: 'Declaration space' });
  const everyone = await makeUser(db, space.id, ['member', 'steward', 'treasurer', 'admin'], 'Declaration admin');
  const plain = await makeUser(db, space.id, ['member'], 'Declaration member');
  staff = new HttpSession();
  await staff.signIn(everyone.email, everyone.password);
  member = new HttpSession();
  await member.signIn(plain.email, plain.password);
  expect(await staff.isSignedIn()).toBe(true);
});
afterAll(closeTestDb);

describe('/api/openapi.json', () => {
  it('is valid OpenAPI 3.1 and lists every route of the build, each method once', async () => {
    const res = await member.get('/api/openapi.json');
    expect(res.status).toBe(200);
    const doc = (await res.json()) as { openapi: string; paths: Record<string, Record<string, unknown>> };
    expect(doc.openapi).toBe('3.1.0');
    const verdict = await new Validator().validate(doc as never);
    expect(verdict.errors ?? []).toEqual([]);
    expect(verdict.valid).toBe(true);

    const documented = Object.entries(doc.paths).flatMap(([p, ops]) => Object.keys(ops).map((m) => `${m.toUpperCase()} ${p}`));
    const onDisk = apiRoutes()
      .filter((r) => r.door === 'app')
      .flatMap((r) => r.methods.map((m) => `${m} ${openApiPath(r.pattern)}`));
    expect(documented.sort()).toEqual(onDisk.sort());
  });

  it('needs a sign-in', async () => {
    expect((await new HttpSession().get('/api/openapi.json')).status).toBe(401);
  });
});

describe('origin check on changes made with a session (finding 4b)', () => {
  it('another origin is a 403 that says why, and nothing changes', async () => {
    const before = (await (await staff.get('/api/calendar/link')).json()) as { url: string };
    staff.origin = 'https://elsewhere.example';
    try {
      const res = await staff.fetch('/api/calendar/link', { method: 'POST' });
      expect(res.status).toBe(403);
      expect(((await res.json()) as ErrorBody).error.message).toMatch(/own pages.*elsewhere\.example/);
      staff.origin = null;
      expect((await staff.fetch('/api/calendar/link', { method: 'POST' })).status).toBe(403);
    } finally {
      staff.origin = new URL(BASE).origin;
    }
    const after = (await (await staff.get('/api/calendar/link')).json()) as { url: string };
    expect(after.url).toBe(before.url);
  });

  it('Sec-Fetch-Site: same-origin or the app’s own Origin is let through', async () => {
    staff.origin = null;
    try {
      const res = await staff.fetch('/api/calendar/link', { method: 'POST', headers: { 'sec-fetch-site': 'same-origin' } });
      expect(res.status).toBe(200);
    } finally {
      staff.origin = new URL(BASE).origin;
    }
    expect((await staff.fetch('/api/calendar/link', { method: 'POST' })).status).toBe(200);
  });

  it('also guards next-auth’s own sign-out', async () => {
    const s = new HttpSession();
    const u = await makeUser(testDb(), (await makeSpace(testDb())).id, ['member']);
    await s.signIn(u.email, u.password);
    s.origin = 'https://elsewhere.example';
    const res = await s.postForm('/api/auth/signout', { csrfToken: 'x' });
    expect(res.status).toBe(403);
  });
});

describe('content types', () => {
  it('a JSON route refuses another type with 415 naming it', async () => {
    const res = await staff.fetch('/api/loans', { method: 'POST', headers: { 'content-type': 'text/plain' }, body: '{}' });
    expect(res.status).toBe(415);
    const body = (await res.json()) as ErrorBody;
    expect(body.error.message).toContain('text/plain');
    expect(Object.keys(body.error.fields ?? {})).toEqual(['content-type']);
  });

  it('the upload refuses JSON with 415, and the auth catch-all refuses JSON with 415 (finding 7)', async () => {
    expect((await staff.post('/api/attachments', { partId: 'x' })).status).toBe(415);
    for (const path of ['/api/auth/anything/else', '/api/auth/callback/password', '/api/auth/signin']) {
      const res = await new HttpSession().post(path, { a: 1 });
      expect(res.status, path).toBe(415);
    }
  });
});

describe('one id rule (finding 6)', () => {
  const idRoutes = apiRoutes()
    .filter((r) => r.door === 'app' && r.pattern.includes('[id]'))
    .flatMap((r) => r.methods.map((method) => ({ method, pattern: r.pattern })));

  it('covers every [id] route', () => {
    expect(idRoutes.length).toBeGreaterThan(20);
  });

  for (const { method, pattern } of idRoutes) {
    it(`${method} ${pattern} with a malformed id is 404`, async () => {
      for (const bad of ['not-a-uuid', '1', "1'%20or%201=1", '00000000-0000-0000-0000-00000000000g']) {
        const res = await staff.fetch(concrete(pattern, { id: bad }), {
          method,
          ...(method === 'GET' || method === 'DELETE' ? {} : { headers: { 'content-type': 'application/json' }, body: '{}' }),
        });
        expect(res.status, bad).toBe(404);
        expect(((await res.json()) as ErrorBody).error.code).toBe('not_found');
      }
    });
  }
});

describe('Content-Security-Policy (finding 8)', () => {
  it('every page carries a nonce-based policy without unsafe-inline scripts, and its scripts carry the nonce', async () => {
    for (const [path, who] of [['/signin', new HttpSession()], ['/bench-check', new HttpSession()], ['/today', member]] as const) {
      const res = await who.get(path);
      expect(res.status, path).toBe(200);
      const csp = res.headers.get('content-security-policy') ?? '';
      const scriptSrc = csp.split(';').find((d) => d.trim().startsWith('script-src')) ?? '';
      const nonce = /'nonce-([^']+)'/.exec(scriptSrc)?.[1];
      expect(nonce, path).toBeTruthy();
      expect(scriptSrc).not.toContain('unsafe-inline');
      const html = await res.text();
      const scripts = [...html.matchAll(/<script\b[^>]*>/g)].map((m) => m[0]);
      expect(scripts.length).toBeGreaterThan(0);
      for (const tag of scripts) expect(tag, path).toContain(`nonce="${nonce}"`);
    }
  });

  it('gives every request its own nonce', async () => {
    const a = (await member.get('/today')).headers.get('content-security-policy');
    const b = (await member.get('/today')).headers.get('content-security-policy');
    expect(a).not.toBe(b);
  });
});

describe('dev mailbox (finding 3)', () => {
  const port = Number(new URL(BASE).port);
  const get = (headers: Record<string, string>) =>
    new Promise<number>((resolve, reject) => {
      http
        .get({ host: '127.0.0.1', port, path: '/dev/mailbox', headers }, (res) => {
          res.resume();
          resolve(res.statusCode ?? 0);
        })
        .on('error', reject);
    });

  it('answers a request addressed to this machine (in the test build)', async () => {
    expect(await get({ host: `127.0.0.1:${port}` })).toBe(200);
  });

  it('never answers a request addressed to another host or relayed from one', async () => {
    expect(await get({ host: 'ohmstead.example' })).toBe(404);
    expect(await get({ host: `127.0.0.1:${port}`, 'x-forwarded-for': '203.0.113.7' })).toBe(404);
    expect(await get({ host: `127.0.0.1:${port}`, forwarded: 'for=203.0.113.7' })).toBe(404);
  });
});
