import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import { mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import net from 'node:net';
import path from 'node:path';
import { sql } from 'kysely';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createDb, type Db } from '@/db/connect';
import { closeTestDb, testDb } from '../helpers/db';
import { HttpSession } from '../helpers/http';
import { productionBuild } from '../helpers/production-build';

// The production path end to end, on loopback: `npm run serve` (scripts/serve.sh) with nothing but an
// env file, on a database with no spaces. It must refuse an incomplete env file naming each variable;
// then migrate (after a backup), never seed the demo, never start the fakes, bind to the configured
// host (127.0.0.2 here, so 127.0.0.1 must refuse), and open the first-run page until the first space
// exists. The mail relay and the processor are the test run's fakes, addressed as real ones would be.
const ROOT = path.resolve(__dirname, '../..');
const dbName = `ohm_prod_${Date.now().toString(36)}_${randomBytes(3).toString('hex')}`;
const dir = mkdtempSync('/var/tmp/ohm-prod.');
const backups = path.join(dir, 'backups');
const secret = randomBytes(32).toString('hex');
const stripeKey = `sk_test_prodcheck_${randomBytes(8).toString('hex')}`;
let dbUrl: string;
let fresh: Db;
let server: ChildProcess | undefined;
let out = '';
let base: string;
let port: number;

async function freePort(): Promise<number> {
  return new Promise((resolve) => {
    const s = net.createServer();
    s.listen(0, '127.0.0.1', () => {
      const { port: p } = s.address() as net.AddressInfo;
      s.close(() => resolve(p));
    });
  });
}

function envFile(vars: Record<string, string>): string {
  const file = path.join(dir, `env-${randomBytes(3).toString('hex')}`);
  writeFileSync(file, Object.entries(vars).map(([k, v]) => `${k}=${JSON.stringify(v)}`).join('\n') + '\n');
  return file;
}

function completeEnv(): Record<string, string> {
  return {
    DATABASE_URL: dbUrl,
    NEXTAUTH_SECRET: secret,
    APP_BASE_URL: base,
    APP_HOST: '127.0.0.2',
    APP_PORT: String(port),
    SMTP_HOST: '127.0.0.1',
    SMTP_PORT: process.env.SMTP_PORT!,
    MAIL_FROM: 'Bench <bench@prodcheck.example>',
    STRIPE_SECRET_KEY: stripeKey,
    STRIPE_WEBHOOK_SECRET: `whsec_prodcheck_${randomBytes(8).toString('hex')}`,
    PAYMENTS_API_HOST: '127.0.0.1',
    PAYMENTS_API_PORT: process.env.PAYMENTS_API_PORT!,
    PAYMENTS_API_PROTOCOL: 'http',
    BACKUP_DIR: backups,
  };
}

// Nothing from the test run's environment: only what a service manager would give.
const bareEnv = (file: string) =>
  ({ PATH: process.env.PATH!, HOME: process.env.HOME ?? '/root', OHM_ENV_FILE: file, OHM_DIST_DIR: '.next-prodcheck' }) as unknown as NodeJS.ProcessEnv;

beforeAll(async () => {
  await sql.raw(`create database ${dbName}`).execute(testDb());
  const u = new URL(process.env.DATABASE_URL!);
  u.pathname = `/${dbName}`;
  dbUrl = u.toString();
  fresh = createDb(dbUrl, 2);
  port = await freePort();
  base = `http://127.0.0.2:${port}`;
  productionBuild();
}, 900_000);

afterAll(async () => {
  if (server && server.exitCode === null) {
    const exited = new Promise((r) => server!.once('exit', r));
    server.kill('SIGTERM');
    await exited;
  }
  await fresh?.destroy();
  await sql.raw(`drop database if exists ${dbName} with (force)`).execute(testDb());
  await closeTestDb();
  rmSync(dir, { recursive: true, force: true });
});

async function waitUp(url: string, ms: number): Promise<void> {
  const deadline = Date.now() + ms;
  for (;;) {
    if (server?.exitCode !== null && server?.exitCode !== undefined) throw new Error(`serve.sh exited ${server.exitCode}:\n${out}`);
    try {
      const r = await fetch(url);
      if (r.status < 500) return;
    } catch {
      // not up yet
    }
    if (Date.now() > deadline) throw new Error(`not up after ${ms} ms:\n${out}`);
    await new Promise((r) => setTimeout(r, 500));
  }
}

const firstRun = (spaceName: string) => ({
  spaceName,
  currency: 'EUR',
  timeZone: 'Europe/Berlin',
  closingTime: '21:30',
  adminName: 'Ada Firstrun',
  adminEmail: 'ada@prodcheck.example',
  password: 'first-run-password-1',
});

describe('npm run serve: a real space from nothing', () => {
  it('refuses an incomplete env file, naming each missing or wrong variable, before touching anything', () => {
    const vars = completeEnv();
    delete (vars as Partial<typeof vars>).SMTP_HOST;
    delete (vars as Partial<typeof vars>).STRIPE_SECRET_KEY;
    const file = envFile({ ...vars, STRIPE_WEBHOOK_SECRET: 'whsec_ohmstead_local_dev_secret', OHM_DEV_MAILBOX: '1' });
    const r = spawnSync('bash', ['scripts/serve.sh'], { cwd: ROOT, env: bareEnv(file), encoding: 'utf8', timeout: 120_000 });
    expect(r.status).toBe(2);
    for (const name of ['SMTP_HOST', 'STRIPE_SECRET_KEY', 'STRIPE_WEBHOOK_SECRET', 'OHM_DEV_MAILBOX']) expect(r.stderr).toContain(name);
    expect(r.stderr).not.toContain('SMTP_PORT'); // only what is wrong is named
  });

  it('migrates after a backup, seeds nothing, starts no fakes, binds the configured host, opens the first run', { timeout: 300_000 }, async () => {
    const before = await sql<{ n: number }>`select count(*)::int as n from information_schema.tables where table_schema = 'public'`.execute(fresh);
    expect(before.rows[0]!.n).toBe(0);
    const child = spawn('bash', ['scripts/serve.sh'], { cwd: ROOT, env: bareEnv(envFile(completeEnv())), stdio: ['ignore', 'pipe', 'pipe'] });
    server = child;
    child.stdout!.on('data', (d) => (out += d));
    child.stderr!.on('data', (d) => (out += d));
    await waitUp(`${base}/signin`, 240_000);

    expect(readdirSync(backups).filter((f) => /^before-migrate-.*\.dump$/.test(f))).toHaveLength(1);
    expect((await fresh.selectFrom('spaces').select('id').execute()).length).toBe(0);
    expect((await fresh.selectFrom('users').select('id').execute()).length).toBe(0);
    // Bound to 127.0.0.2 only.
    await expect(fetch(`http://127.0.0.1:${port}/signin`)).rejects.toThrow();
    // No fake among the processes serve.sh left running (it execs into the app).
    const cmdlines = readdirSync('/proc')
      .filter((p) => /^\d+$/.test(p))
      .map((p) => {
        try {
          return readFileSync(`/proc/${p}/environ`, 'utf8').includes(`OHM_ENV_FILE=`) ? readFileSync(`/proc/${p}/cmdline`, 'utf8') : '';
        } catch {
          return '';
        }
      })
      .filter(Boolean);
    expect(cmdlines.length).toBeGreaterThan(0);
    expect(cmdlines.filter((c) => c.includes('fakes/'))).toEqual([]);

    const page = await fetch(`${base}/first-run`);
    expect(page.status).toBe(200);
    expect(await page.text()).toContain('Set up your space');
  });

  it('two first runs at once make one space; its admin signs in; the first run is gone; a part is made', { timeout: 120_000 }, async () => {
    const post = (name: string) =>
      fetch(`${base}/api/first-run`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify(firstRun(name)) });
    const bad = await fetch(`${base}/api/first-run`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ ...firstRun('X'), currency: 'EURO' }) });
    expect(bad.status).toBe(400);
    expect(Object.keys(((await bad.json()) as { error: { fields: object } }).error.fields)).toEqual(['currency']);

    const answers = await Promise.all([post('Lindenhof Werkbank'), post('Second Try')]);
    expect(answers.map((r) => r.status).sort()).toEqual([201, 404]);
    const spaces = await fresh.selectFrom('spaces').selectAll().execute();
    expect(spaces).toHaveLength(1);
    expect(spaces[0]).toMatchObject({ currency: 'EUR', time_zone: 'Europe/Berlin', closing_time: '21:30' });
    const [membership] = await fresh.selectFrom('memberships').select('roles').execute();
    expect(membership!.roles).toEqual(['admin']);

    const admin = new HttpSession(base);
    await admin.signIn('ada@prodcheck.example', 'first-run-password-1');
    expect(await admin.isSignedIn()).toBe(true);

    expect((await fetch(`${base}/first-run`)).status).toBe(404);
    expect((await post('Third')).status).toBe(404);
    expect(await fresh.selectFrom('spaces').select('id').execute()).toHaveLength(1);

    const part = await admin.post('/api/parts', { sku: 'CONS-001', name: 'Heat-shrink assortment', category: 'consumable', tracking: 'counted' });
    expect(part.status).toBe(201);
    const listed = (await (await admin.get('/api/parts')).json()) as { items?: Array<{ sku: string }> } | Array<{ sku: string }>;
    expect(JSON.stringify(listed)).toContain('CONS-001');
  });

  it('has no dev mailbox, test hooks or bench floors', async () => {
    expect((await fetch(`${base}/dev/mailbox`)).status).toBe(404);
    expect((await fetch(`${base}/api/test/clock`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: '{"offsetMs":0}' })).status).toBe(404);
    expect((await fetch(`${base}/api/payments/test-endpoint`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: '{}' })).status).toBe(404);
    expect((await fetch(`${base}/api/bench-floor/scan/ABC`)).status).toBe(404);
  });

  it('answers /api/health with database, jobs and mail, no secrets, and logs JSON lines carrying the request id', { timeout: 60_000 }, async () => {
    const requestId = `prodcheck-${randomBytes(6).toString('hex')}`;
    // The job runners schedule themselves shortly after start.
    let res: Response;
    const deadline = Date.now() + 30_000;
    do {
      res = await fetch(`${base}/api/health`, { headers: { 'x-request-id': requestId } });
      if (res.status === 200 || Date.now() > deadline) break;
      await new Promise((r) => setTimeout(r, 1000));
    } while (true);
    const text = await res.text();
    expect(res.status, text).toBe(200);
    const body = JSON.parse(text) as { ok: boolean; version: string; checks: Record<string, { ok: boolean }> };
    expect(body.ok).toBe(true);
    expect(Object.keys(body.checks).sort()).toEqual(['database', 'jobs', 'mail']);
    expect(body.version).toMatch(/^\d+\.\d+\.\d+/);
    for (const s of [secret, stripeKey, dbUrl, process.env.SMTP_PORT!, 'postgres']) expect(text).not.toContain(s);
    expect(res.headers.get('x-request-id')).toBe(requestId);

    await new Promise((r) => setTimeout(r, 300));
    // Complete lines only (the last may still be being written).
    const lines = out
      .split('\n')
      .slice(0, -1)
      .filter((l) => l.startsWith('{'))
      .map((l) => JSON.parse(l) as Record<string, unknown>);
    const mine = lines.filter((l) => l.requestId === requestId);
    expect(mine.length).toBeGreaterThan(0);
    expect(mine[0]).toMatchObject({ path: '/api/health', status: 200, app: 'ohmstead' });
    // Every JSON line names a request id (a request's, a job run's, or 'none' outside both).
    expect(lines.every((l) => typeof l.requestId === 'string')).toBe(true);
  });

  it('Settings warns that the public address is a loopback one', async () => {
    const admin = new HttpSession(base);
    await admin.signIn('ada@prodcheck.example', 'first-run-password-1');
    const html = await (await admin.get('/settings')).text();
    expect(html).toContain('loopback address');
  });
});
