import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { parseEnv } from '@/lib/env';
import { PEER_HEADER, stampPeerAddress } from '@/lib/auth/peer';
import { sourceOf } from '@/lib/auth/throttle';

// Which address the sign-in throttle counts against. Before TRUSTED_PROXY_HOPS it always took the last
// X-Forwarded-For entry, which a client talking to the app directly writes itself: each guess could come
// from a "new" address. Now the chain is the header's entries followed by the connection's own address,
// and the setting says how many of its last entries trusted proxies appended.

describe('sourceOf', () => {
  const h = (xff: string | undefined, peer: string | undefined) => ({
    ...(xff === undefined ? {} : { 'x-forwarded-for': xff }),
    ...(peer === undefined ? {} : { [PEER_HEADER]: peer }),
  });

  it('no proxy (0): the connection’s own address, whatever the header says', () => {
    expect(sourceOf(h('203.0.113.9', '198.51.100.4'), 0)).toBe('198.51.100.4');
    expect(sourceOf(h('203.0.113.9, 203.0.113.10', '198.51.100.4'), 0)).toBe('198.51.100.4');
    expect(sourceOf(h(undefined, '::ffff:198.51.100.4'), 0)).toBe('198.51.100.4');
  });

  it('one proxy (1): the entry it appended, not what the client wrote before it', () => {
    // client wrote 203.0.113.9; the proxy appended the client's real address 192.0.2.50; the peer is the proxy.
    expect(sourceOf(h('203.0.113.9, 192.0.2.50', '10.0.0.2'), 1)).toBe('192.0.2.50');
    expect(sourceOf(h('192.0.2.50', '10.0.0.2'), 1)).toBe('192.0.2.50');
  });

  it('two proxies (2): the entry the outer one appended', () => {
    expect(sourceOf(h('203.0.113.9, 192.0.2.50, 10.0.0.7', '10.0.0.2'), 2)).toBe('192.0.2.50');
  });

  it('more hops than entries: the first entry, never undefined', () => {
    expect(sourceOf(h(undefined, '198.51.100.4'), 3)).toBe('198.51.100.4');
    expect(sourceOf(h(undefined, undefined), 0)).toBe('unknown');
  });

  it('without the stamp (a server other than next start), Next’s own X-Forwarded-For stands in for the peer', () => {
    expect(sourceOf(h('198.51.100.4', undefined), 0)).toBe('198.51.100.4');
  });
});

describe('TRUSTED_PROXY_HOPS in lib/env.ts', () => {
  const base = { DATABASE_URL: 'postgres://postgres@127.0.0.1:5432/ohmstead', NEXTAUTH_SECRET: 'a-session-secret-long-enough' };
  it('defaults to 0 (no proxy trusted)', () => {
    expect(parseEnv(base).TRUSTED_PROXY_HOPS).toBe(0);
  });
  it('reads a count and refuses anything else, naming the variable', () => {
    expect(parseEnv({ ...base, TRUSTED_PROXY_HOPS: '2' }).TRUSTED_PROXY_HOPS).toBe(2);
    expect(() => parseEnv({ ...base, TRUSTED_PROXY_HOPS: '-1' })).toThrow(/TRUSTED_PROXY_HOPS/);
    expect(() => parseEnv({ ...base, TRUSTED_PROXY_HOPS: 'all' })).toThrow(/TRUSTED_PROXY_HOPS/);
  });
});

describe('stampPeerAddress: the connection’s address on every request, the client’s own header replaced', () => {
  let server: http.Server;
  let port: number;
  beforeAll(async () => {
    stampPeerAddress();
    stampPeerAddress(); // twice is once
    server = http.createServer((req, res) => res.end(JSON.stringify(req.headers)));
    await new Promise<void>((r) => server.listen(0, '127.0.0.1', r));
    port = (server.address() as AddressInfo).port;
  });
  afterAll(() => new Promise<void>((r) => server.close(() => r())));

  const send = (headers: Record<string, string>, localAddress: string) =>
    new Promise<Record<string, string>>((resolve, reject) => {
      const req = http.request({ host: '127.0.0.1', port, path: '/', headers, localAddress }, (res) => {
        let text = '';
        res.on('data', (d) => (text += d));
        res.on('end', () => resolve(JSON.parse(text)));
      });
      req.on('error', reject);
      req.end();
    });

  it('a forged peer header and X-Forwarded-For change nothing: the socket decides', async () => {
    const got = await send({ [PEER_HEADER]: '203.0.113.9', 'x-forwarded-for': '203.0.113.10' }, '127.0.0.41');
    expect(got[PEER_HEADER]).toBe('127.0.0.41');
    expect(sourceOf(got, 0)).toBe('127.0.0.41');
    expect(sourceOf(got, 1)).toBe('203.0.113.10');
  });
});
