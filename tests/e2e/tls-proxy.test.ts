import { execFileSync, spawn, type ChildProcess } from 'node:child_process';
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import http from 'node:http';
import net from 'node:net';
import path from 'node:path';
import { PDFDocument } from 'pdf-lib';
import { chromium, type Browser, type BrowserContext } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeTestDb, testDb } from '../helpers/db';
import { labelUrl } from '@/labels/url';
import { signInPage } from '../helpers/browser';
import { bounds, decodeRects, pageContent, readLabels } from '../helpers/label-read-back';

// A real space's way in, on loopback: deploy/Caddyfile itself (Debian's caddy, its internal CA) in front
// of the app, whose APP_BASE_URL is the public https address. The browser trusts the CA the way a phone
// does — fetched over plain http from /ca.crt and installed (here into Chromium's NSS store) — so an
// untrusted certificate would fail the navigation; then the member signs in over https, the scanner opens
// the camera (a secure context, permission granted, Chromium's fake camera) and a steward's printed label
// carries the public address in its QR (read back with jsQR, the independent ISO/IEC 18004 decoder).
const ROOT = path.resolve(__dirname, '../..');
const SITE = 'bench.test';
const dir = mkdtempSync('/var/tmp/ohm-tls.');
const home = path.join(dir, 'home');
let app: ChildProcess | undefined;
let caddy: ChildProcess | undefined;
let browser: Browser | undefined;
let httpPort: number;
let publicBase: string;
const logs: string[] = [];

async function freePort(): Promise<number> {
  return new Promise((resolve) => {
    const s = net.createServer();
    s.listen(0, '127.0.0.1', () => {
      const { port } = s.address() as net.AddressInfo;
      s.close(() => resolve(port));
    });
  });
}

/** A plain-http request to loopback with the site's name in Host, as a phone on the LAN would send it. */
function plainHttp(pathname: string): Promise<{ status: number; headers: http.IncomingHttpHeaders; body: string }> {
  return new Promise((resolve, reject) => {
    const req = http.get({ host: '127.0.0.1', port: httpPort, path: pathname, headers: { host: SITE } }, (res) => {
      let body = '';
      res.setEncoding('utf8');
      res.on('data', (c: string) => (body += c));
      res.on('end', () => resolve({ status: res.statusCode ?? 0, headers: res.headers, body }));
    });
    req.on('error', reject);
  });
}

async function until<T>(what: string, probe: () => Promise<T | null>, ms = 90_000): Promise<T> {
  const end = Date.now() + ms;
  for (;;) {
    const got = await probe().catch(() => null);
    if (got !== null) return got;
    if (Date.now() > end) throw new Error(`${what} did not come up:\n${logs.join('').slice(-3000)}`);
    await new Promise((r) => setTimeout(r, 250));
  }
}

function started(cmd: string, args: string[], env: NodeJS.ProcessEnv): ChildProcess {
  const child = spawn(cmd, args, { cwd: ROOT, env, stdio: ['ignore', 'pipe', 'pipe'] });
  child.stdout?.on('data', (c) => logs.push(String(c)));
  child.stderr?.on('data', (c) => logs.push(String(c)));
  return child;
}

let caPem = '';

beforeAll(async () => {
  const [appPort, httpsPort] = [await freePort(), await freePort()];
  httpPort = await freePort();
  publicBase = `https://${SITE}:${httpsPort}`;
  // The test build again, now as a space behind one proxy would run it; no job workers (the suite's app runs them).
  app = started('node', ['node_modules/next/dist/bin/next', 'start', '-p', String(appPort), '-H', '127.0.0.1'], {
    ...process.env,
    APP_BASE_URL: publicBase,
    NEXTAUTH_URL: publicBase,
    TRUSTED_PROXY_HOPS: '1',
    OHM_JOBS: '0',
  });
  caddy = started('caddy', ['run', '--config', 'deploy/Caddyfile', '--adapter', 'caddyfile'], {
    ...process.env,
    HOME: dir,
    OHM_SITE: SITE,
    OHM_APP_PORT: String(appPort),
    OHM_HTTP_PORT: String(httpPort),
    OHM_HTTPS_PORT: String(httpsPort),
    OHM_CADDY_DATA: path.join(dir, 'caddy'),
    OHM_CADDY_ADMIN: 'off',
  });
  await until('the app', async () => {
    const res = await fetch(`http://127.0.0.1:${appPort}/signin`);
    return res.status === 200 ? true : null;
  });
  // The phone's first step (README, "Phones trust the internal CA once"): the CA over plain http.
  const ca = await until('the CA certificate on /ca.crt', async () => {
    const res = await plainHttp('/ca.crt');
    return res.status === 200 ? res : null;
  });
  expect(ca.headers['content-type']).toBe('application/x-x509-ca-cert');
  caPem = ca.body;
  const caFile = path.join(dir, 'ca.crt');
  writeFileSync(caFile, caPem);
  // Chromium on Linux trusts what the NSS store in $HOME/.pki/nssdb trusts (certutil: libnss3-tools).
  const nss = path.join(home, '.pki/nssdb');
  mkdirSync(nss, { recursive: true });
  execFileSync('certutil', ['-N', '-d', `sql:${nss}`, '--empty-password']);
  execFileSync('certutil', ['-A', '-d', `sql:${nss}`, '-n', 'Bench CA (test)', '-t', 'C,,', '-i', caFile]);
  browser = await chromium.launch({
    executablePath: '/usr/bin/chromium',
    headless: true,
    env: { ...process.env, HOME: home },
    args: [
      '--no-sandbox',
      '--disable-gpu',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-quic',
      '--no-first-run',
      '--disable-sync',
      // The LAN name reaches Caddy on loopback, as the space's DNS or hosts file would send it.
      `--host-resolver-rules=MAP ${SITE} 127.0.0.1`,
      // A camera the headless browser can open: Chromium's own test pattern.
      '--use-fake-device-for-media-stream',
    ],
  });
}, 300_000);

afterAll(async () => {
  await browser?.close();
  for (const child of [caddy, app]) child?.kill('SIGTERM');
  await closeTestDb();
  rmSync(dir, { recursive: true, force: true });
});

async function phone(): Promise<BrowserContext> {
  const context = await browser!.newContext({ viewport: { width: 390, height: 844 }, baseURL: publicBase });
  await context.grantPermissions(['camera'], { origin: publicBase });
  return context;
}

describe('through the TLS proxy', () => {
  it('serves only the CA over plain http and sends everything else to https', async () => {
    expect(caPem).toContain('-----BEGIN CERTIFICATE-----');
    const other = await plainHttp('/scan');
    expect(other.status).toBe(301);
    expect(other.headers.location).toBe(`https://${SITE}/scan`);
  });

  it('a member signs in over https with the CA trusted and scans with the camera', async () => {
    const context = await phone();
    const page = await context.newPage();
    // No ignoreHTTPSErrors: an untrusted certificate fails this navigation.
    const first = await page.goto('/signin');
    expect(first?.status()).toBe(200);
    expect((await first!.securityDetails())?.issuer).toMatch(/Caddy Local Authority/);
    expect(first!.headers()['strict-transport-security']).toBe('max-age=31536000');
    await signInPage(page, 'juniper@quillmere.example');
    // Pages and API answers alike carry exactly one HSTS header (the app's, or Caddy's where it lacks one).
    const apiHsts = await page.evaluate(async () => (await fetch('/api/health')).headers.get('strict-transport-security'));
    expect(apiHsts).toBe('max-age=31536000');
    const cookie = (await context.cookies()).find((c) => c.name.endsWith('next-auth.session-token'));
    expect(cookie).toMatchObject({ name: '__Secure-next-auth.session-token', secure: true, httpOnly: true });

    await page.goto('/scan');
    expect(await page.evaluate(() => window.isSecureContext)).toBe(true);
    await page.getByRole('button', { name: 'Use camera' }).click();
    const video = page.getByLabel("Camera view: hold a label's QR in the square");
    await video.waitFor();
    await page.waitForFunction(() => {
      const v = document.querySelector('video');
      return !!v && v.readyState >= 2 && v.videoWidth > 0;
    });
    await page.getByRole('button', { name: 'Stop camera' }).waitFor();
    expect(await page.evaluate(() => document.documentElement.scrollWidth <= window.innerWidth)).toBe(true);
    await context.close();
  });

  it("a steward's printed label carries the public address in its QR", async () => {
    const part = await testDb()
      .selectFrom('parts')
      .innerJoin('spaces', 'spaces.id', 'parts.space_id')
      .select(['parts.code'])
      .where('spaces.slug', '=', 'quillmere')
      .where('parts.code', 'is not', null)
      .orderBy('parts.created_at')
      .executeTakeFirstOrThrow();
    const context = await phone();
    const page = await context.newPage();
    await signInPage(page, 'tobiah@quillmere.example');
    // From the page itself, so the request carries the browser's Origin and cookie through Caddy.
    const pdfBase64 = await page.evaluate(async (code) => {
      const res = await fetch('/api/labels', {
        method: 'POST',
        headers: { 'content-type': 'application/json' },
        body: JSON.stringify({ selection: { kind: 'codes', codes: [code] } }),
      });
      if (!res.ok) throw new Error(`${res.status} ${await res.text()}`);
      const bytes = new Uint8Array(await res.arrayBuffer());
      let s = '';
      for (const b of bytes) s += String.fromCharCode(b);
      return btoa(s);
    }, part.code!);
    const doc = await PDFDocument.load(Buffer.from(pdfBase64, 'base64'));
    const [label] = readLabels(pageContent(doc, doc.getPage(0)));
    const symbol = bounds(label.filled);
    const quiet = 4 * Math.min(...label.filled.map((r) => r.h));
    const decoded = decodeRects(
      label.filled,
      { x: symbol.x - quiet, y: symbol.y - quiet, w: symbol.w + 2 * quiet, h: symbol.h + 2 * quiet },
      8,
    );
    expect(decoded?.data.startsWith(`${publicBase}/s/`)).toBe(true);
    expect(decoded?.data).toBe(labelUrl(publicBase, part.code!));
    await context.close();
  });
});
