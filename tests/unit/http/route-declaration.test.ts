import { beforeAll, describe, expect, it } from 'vitest';
import { z } from 'zod';

// lib/http/route.ts in process, with real Requests: the fixed order of the steps and their answers.
// Only anonymous and signature routes run here (no database); the signed-in paths go through real HTTP
// in tests/integration/api-declaration.test.ts.
const BASE = 'http://127.0.0.1:3999';
let mod: typeof import('@/lib/http/route');

beforeAll(async () => {
  Object.assign(process.env, {
    DATABASE_URL: 'postgres://postgres@127.0.0.1:1/none',
    NEXTAUTH_SECRET: 'unit-test-secret-long-enough',
    APP_BASE_URL: BASE,
  });
  mod = await import('@/lib/http/route');
});

const COOKIE = 'next-auth.session-token=abc';
const req = (path: string, init: RequestInit & { headers?: Record<string, string> } = {}) => new Request(BASE + path, init);
const ctx = (params: Record<string, string> = {}) => ({ params: Promise.resolve(params) });

describe('origin check (state-changing requests carrying a session cookie)', () => {
  const post = () =>
    mod.route({ method: 'POST', summary: 't', who: 'anonymous', run: async () => ({ reached: true }) });

  it('refuses another origin with 403 and says why', async () => {
    const res = await post()(req('/x', { method: 'POST', headers: { cookie: COOKIE, origin: 'https://evil.example' } }));
    expect(res.status).toBe(403);
    const body = await res.json();
    expect(body.error.message).toMatch(/own pages/);
    expect(body.error.message).toContain('https://evil.example');
  });

  it('refuses a request with a session but no Origin and no Sec-Fetch-Site', async () => {
    expect((await post()(req('/x', { method: 'POST', headers: { cookie: COOKIE } }))).status).toBe(403);
  });

  it('lets the app’s own origin, or Sec-Fetch-Site: same-origin, through', async () => {
    expect((await post()(req('/x', { method: 'POST', headers: { cookie: COOKIE, origin: BASE } }))).status).toBe(200);
    expect((await post()(req('/x', { method: 'POST', headers: { cookie: COOKIE, 'sec-fetch-site': 'same-origin' } }))).status).toBe(200);
  });

  it('does not apply without a session cookie, to GET, or to a signature route', async () => {
    expect((await post()(req('/x', { method: 'POST', headers: { origin: 'https://evil.example' } }))).status).toBe(200);
    const get = mod.route({ method: 'GET', summary: 't', who: 'anonymous', run: async () => ({}) });
    expect((await get(req('/x', { headers: { cookie: COOKIE, origin: 'https://evil.example' } }))).status).toBe(200);
    const hook = mod.route({ method: 'POST', summary: 't', who: 'signature', run: async () => ({}) });
    expect((await hook(req('/x', { method: 'POST', headers: { cookie: COOKIE, origin: 'https://processor.example' } }))).status).toBe(200);
  });
});

describe('params, query and body', () => {
  it('a malformed id is 404 naming the record, before the body is read', async () => {
    let ran = false;
    const h = mod.route({
      method: 'POST',
      summary: 't',
      who: 'anonymous',
      params: mod.idParams,
      notFound: 'loan',
      body: mod.json(z.object({ a: z.number() })),
      run: async () => {
        ran = true;
        return {};
      },
    });
    const res = await h(req('/x', { method: 'POST', headers: { 'content-type': 'text/plain' }, body: 'x' }), ctx({ id: 'not-a-uuid' }));
    expect(res.status).toBe(404);
    expect((await res.json()).error.message).toBe('No such loan.');
    expect(ran).toBe(false);
  });

  it('a JSON route refuses another content type with 415 naming it', async () => {
    const h = mod.route({ method: 'POST', summary: 't', who: 'anonymous', body: mod.json(z.object({ a: z.number() })), run: async () => ({}) });
    const res = await h(req('/x', { method: 'POST', headers: { 'content-type': 'text/plain' }, body: '{"a":1}' }));
    expect(res.status).toBe(415);
    const body = await res.json();
    expect(body.error.message).toContain('text/plain');
    expect(Object.keys(body.error.fields)).toEqual(['content-type']);
    const form = await h(req('/x', { method: 'POST', headers: { 'content-type': 'application/x-www-form-urlencoded' }, body: 'a=1' }));
    expect(form.status).toBe(415);
  });

  it('a bad body is 400 naming each field; a good one reaches the service parsed', async () => {
    const h = mod.route({
      method: 'POST',
      summary: 't',
      who: 'anonymous',
      body: mod.json(z.object({ a: z.number(), b: z.string() })),
      status: 201,
      run: async ({ body }) => ({ sum: body.a, b: body.b }),
    });
    const bad = await h(req('/x', { method: 'POST', headers: { 'content-type': 'application/json' }, body: '{"a":"x"}' }));
    expect(bad.status).toBe(400);
    expect(Object.keys((await bad.json()).error.fields).sort()).toEqual(['a', 'b']);
    const good = await h(req('/x', { method: 'POST', headers: { 'content-type': 'application/json; charset=utf-8' }, body: '{"a":2,"b":"y"}' }));
    expect(good.status).toBe(201);
    expect(await good.json()).toEqual({ sum: 2, b: 'y' });
  });

  it('a bad query is 400 naming the field', async () => {
    const h = mod.route({ method: 'GET', summary: 't', who: 'anonymous', query: z.object({ month: z.string().regex(/^\d{4}-\d{2}$/) }), run: async () => ({}) });
    const res = await h(req('/x?month=soon'));
    expect(res.status).toBe(400);
    expect(Object.keys((await res.json()).error.fields)).toEqual(['month']);
  });

  it('an upload must be multipart, and a chunked body past the limit is cut off with 413', async () => {
    const h = mod.route({
      method: 'POST',
      summary: 't',
      who: 'anonymous',
      body: mod.multipart(z.object({ note: z.string() }), 1024),
      run: async ({ body }) => ({ note: body.note }),
    });
    const wrongType = await h(req('/x', { method: 'POST', headers: { 'content-type': 'application/json' }, body: '{}' }));
    expect(wrongType.status).toBe(415);

    let pulled = 0;
    const endless = new ReadableStream<Uint8Array>({
      pull(c) {
        pulled += 1;
        c.enqueue(new Uint8Array(512).fill(65)); // never ends: only the limit stops the reading
      },
    });
    const big = new Request(BASE + '/x', {
      method: 'POST',
      headers: { 'content-type': 'multipart/form-data; boundary=zz' },
      body: endless,
      // @ts-expect-error Node's fetch needs this for a streamed body
      duplex: 'half',
    });
    const res = await h(big);
    expect(res.status).toBe(413);
    expect(pulled).toBeLessThan(10);

    const form = new FormData();
    form.set('note', 'hello');
    const ok = await h(new Request(BASE + '/x', { method: 'POST', body: form }));
    expect(ok.status).toBe(200);
    expect(await ok.json()).toEqual({ note: 'hello' });
  });
});

describe('typed errors', () => {
  it('a service’s typed error keeps its status, message and fields', async () => {
    const { ConflictError } = await import('@/lib/errors');
    const conflict = mod.route({ method: 'GET', summary: 't', who: 'anonymous', run: async () => { throw new ConflictError('taken', { qty: ['only 2 left'] }); } });
    const res = await conflict(req('/x'));
    expect(res.status).toBe(409);
    expect((await res.json()).error).toEqual({ code: 'conflict', message: 'taken', fields: { qty: ['only 2 left'] } });
  });
});
