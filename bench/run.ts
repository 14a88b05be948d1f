// `npm run bench` (scripts/bench.sh) runs this against a production build, its framework floor and the raw
// floor, all on loopback and on the same throwaway PostgreSQL, and prints the figures beside the targets
// in README.md (Performance); they also go to bench/out/latest.md.
// Env: BENCH_APP_URL (the production build, started with OHM_BENCH=1), BENCH_RAW_URL (bench/raw-floor.ts),
// BENCH_FIXTURE (written by bench/data.ts), BENCH_DIST_DIR (the build's folder), DATABASE_URL.
// A case whose server is not given, or whose product route is not in the build yet, is skipped with a note.
import { spawnSync } from 'node:child_process';
import { mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import pg from 'pg';
import type { Fixture } from './data';
import { firstLoadFromHtml, firstLoadFromManifests, type JsSize } from './first-load-js';
import { load, row, TABLE_HEAD, warm, type Figures, type Target } from './load';

const ROOT = path.resolve(__dirname, '..');
const APP = process.env.BENCH_APP_URL ?? '';
const RAW = process.env.BENCH_RAW_URL ?? '';
const DIST = process.env.BENCH_DIST_DIR ?? '.next-bench';
const fixture = JSON.parse(readFileSync(process.env.BENCH_FIXTURE ?? 'bench/out/fixture.json', 'utf8')) as Fixture;
const pool = new pg.Pool({ connectionString: process.env.DATABASE_URL, max: 2 });

// Durations (seconds) and sizes: the whole run stays within a few minutes on 2 cores.
const MAX = { connections: 10, duration: 8 };
const BORROW_AMOUNT = 3_000; // per target: 50 loans per member, under the limit of 100 open loans
const STEADY_LOOKUP = { connections: 10, duration: 10, rate: 200 };
const STEADY_BORROW = { connections: 10, duration: 10, rate: 50 };
const STEADY_PARTS = { connections: 5, duration: 10, rate: 20 };

const report: string[] = [];
const say = (line = '') => {
  console.log(line);
  report.push(line);
};
const verdict = (ok: boolean) => (ok ? 'met' : 'MISSED');
const ratio = (a: number, b: number) => (b > 0 ? (a / b).toFixed(2) : '–');

type Session = { cookie: string };
async function signIn(email: string): Promise<Session> {
  process.env.TEST_BASE_URL = APP;
  const { HttpSession } = await import('../tests/helpers/http');
  const s = new HttpSession();
  await s.signIn(email, fixture.password);
  if (!(await s.isSignedIn())) throw new Error(`bench sign-in failed for ${email}`);
  return { cookie: s.cookieHeader() };
}

/** Signs the members in, four at a time (each costs a password-hash comparison on the server). */
async function signInAll(emails: string[]): Promise<Session[]> {
  const out: Session[] = new Array(emails.length);
  for (let i = 0; i < emails.length; i += 4) {
    await Promise.all(emails.slice(i, i + 4).map(async (e, k) => (out[i + k] = await signIn(e))));
  }
  return out;
}

/** Is the product route in this build? A route that does not exist answers Next's 404 page (HTML). */
async function routeMissing(url: string, init: RequestInit): Promise<string | null> {
  const res = await fetch(url, init);
  const type = res.headers.get('content-type') ?? '';
  await res.arrayBuffer();
  if (res.status === 404 && !type.includes('json')) return `${new URL(url).pathname} answers 404 (not in this build yet)`;
  if (res.status >= 300) return `${new URL(url).pathname} answered ${res.status} to a valid request`;
  return null;
}

async function runCase(targets: Target[], shape: { connections: number; duration?: number; amount?: number }, before?: () => Promise<void>) {
  const figures: Figures[] = [];
  for (const t of targets) {
    await before?.();
    await warm(t);
    await before?.();
    figures.push(await load(t, shape));
  }
  return figures;
}

function table(figures: Figures[]) {
  for (const line of TABLE_HEAD) say(line);
  for (const f of figures) say(row(f));
  say();
}

async function lookupCase(member: Session | null) {
  say('## Scan → item lookup (`GET /api/scan/<code>`)');
  say();
  const codes = fixture.unitCodes;
  const code = (i: number) => encodeURIComponent(codes[(i * 7919) % codes.length]);
  const targets: Target[] = [];
  const missing = member ? await routeMissing(`${APP}/api/scan/${code(0)}`, { headers: { cookie: member.cookie } }) : 'no app server given';
  if (missing) say(`Product route skipped: ${missing}.`);
  else targets.push({ label: 'product', origin: APP, method: 'GET', request: (i) => ({ path: `/api/scan/${code(i)}`, headers: { cookie: member!.cookie } }) });
  const noFloor = APP ? await routeMissing(`${APP}/api/bench-floor/scan/${code(0)}`, {}) : 'no app server given';
  if (noFloor) say(`Framework floor skipped: ${noFloor}; it answers only on a server started with OHM_BENCH=1.`);
  else targets.push({ label: 'framework floor', origin: APP, method: 'GET', request: (i) => ({ path: `/api/bench-floor/scan/${code(i)}` }) });
  if (RAW) targets.push({ label: 'raw floor', origin: RAW, method: 'GET', request: (i) => ({ path: `/scan/${code(i)}` }) });
  say(`Unit labels of the 10,000-part shelf, a different code each request; ${MAX.connections} connections, ${MAX.duration} s each after a 2 s warm-up.`);
  say();
  const max = await runCase(targets, MAX);
  table(max);
  const steady: Figures[] = [];
  for (const t of targets) steady.push(await load(t, STEADY_LOOKUP));
  say(`Steady ${STEADY_LOOKUP.rate} requests/s for ${STEADY_LOOKUP.duration} s (latency corrected for coordinated omission):`);
  say();
  table(steady);
  const by = (fs: Figures[], label: string) => fs.find((f) => f.label === label);
  const p = by(max, 'product');
  const fw = by(max, 'framework floor');
  const raw = by(max, 'raw floor');
  if (p && fw) say(`- product ÷ framework floor throughput: **${ratio(p.rps, fw.rps)}** (target ≥ 0.7: ${verdict(p.rps >= 0.7 * fw.rps)})`);
  if (p && raw) say(`- product ÷ raw floor throughput: **${ratio(p.rps, raw.rps)}** (reported); framework floor ÷ raw floor: ${fw ? ratio(fw.rps, raw.rps) : '–'}`);
  const ps = by(steady, 'product');
  if (ps) say(`- product p99 at a steady ${STEADY_LOOKUP.rate}/s: **${ps.p99.toFixed(1)} ms** (target < 25 ms: ${verdict(ps.p99 < 25 && ps.rps >= STEADY_LOOKUP.rate * 0.95)})`);
  say();
}

/** Marks every open loan of the bench space returned, so each run starts under the open-loan limit. */
async function closeBenchLoans() {
  await pool.query(`update loans set status = 'returned', returned_at = now() where space_id = $1 and status = 'out'`, [fixture.spaceId]);
}

async function borrowCase(members: Session[]) {
  say('## Borrow transaction (`POST /api/loans`, one counted item)');
  say();
  const n = fixture.members.length;
  const item = (i: number) => fixture.borrowables[(i * 31) % fixture.borrowables.length];
  const floorBody = (i: number) => ({ spaceId: fixture.spaceId, borrowerId: fixture.members[i % n].id, ...item(i) });
  const productReq = (i: number) => ({
    path: '/api/loans',
    // A browser on the app's own pages sends its Origin with a change (lib/http/route.ts checks it).
    headers: { cookie: members[i % n].cookie, origin: new URL(APP).origin },
    body: { counted: [{ ...item(i), qty: 1 }] },
  });
  const targets: Target[] = [];
  let missing: string | null = members.length ? null : 'no app server given';
  if (!missing) {
    await closeBenchLoans();
    const r = productReq(0);
    missing = await routeMissing(`${APP}${r.path}`, { method: 'POST', headers: { ...r.headers, 'content-type': 'application/json' }, body: JSON.stringify(r.body) });
  }
  if (missing) say(`Product route skipped: ${missing}.`);
  else targets.push({ label: 'product', origin: APP, method: 'POST', request: productReq });
  const noFloor = APP
    ? await routeMissing(`${APP}/api/bench-floor/loans`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify(floorBody(0)) })
    : 'no app server given';
  if (noFloor) say(`Framework floor skipped: ${noFloor}; it answers only on a server started with OHM_BENCH=1.`);
  else targets.push({ label: 'framework floor', origin: APP, method: 'POST', request: (i) => ({ path: '/api/bench-floor/loans', body: floorBody(i) }) });
  if (RAW) targets.push({ label: 'raw floor', origin: RAW, method: 'POST', request: (i) => ({ path: '/loans', body: floorBody(i) }) });
  say(
    `${n} members borrowing ${fixture.borrowables.length} different counted tools in turn; ${BORROW_AMOUNT} borrows per target on ${MAX.connections} connections ` +
      `after a 2 s warm-up (open loans closed between runs: the limit is 100 per member).`,
  );
  say();
  const max = await runCase(targets, { connections: MAX.connections, amount: BORROW_AMOUNT }, closeBenchLoans);
  table(max);
  const steady: Figures[] = [];
  for (const t of targets) {
    await closeBenchLoans();
    steady.push(await load(t, STEADY_BORROW));
  }
  say(`Steady ${STEADY_BORROW.rate} borrows/s for ${STEADY_BORROW.duration} s:`);
  say();
  table(steady);
  const p = max.find((f) => f.label === 'product');
  const fw = max.find((f) => f.label === 'framework floor');
  const raw = max.find((f) => f.label === 'raw floor');
  if (p) say(`- product: **${p.rps.toFixed(0)} borrows/s** (target ≥ 300: ${verdict(p.rps >= 300)})`);
  if (p && fw) say(`- product ÷ framework floor: ${ratio(p.rps, fw.rps)}; product ÷ raw floor: ${raw ? ratio(p.rps, raw.rps) : '–'}`);
  const ps = steady.find((f) => f.label === 'product');
  if (ps) say(`- product p99 at a steady ${STEADY_BORROW.rate}/s: **${ps.p99.toFixed(1)} ms** (target < 50 ms: ${verdict(ps.p99 < 50 && ps.rps >= STEADY_BORROW.rate * 0.95)})`);
  await closeBenchLoans();
  say();
}

// A mix of what people do with the parts table: sort by each column, filter by category and text,
// the reorder list, deep pages.
const PARTS_QUERIES = [
  'sort=name&dir=asc&page=1',
  'sort=name&dir=desc&page=37',
  'sort=sku&page=12',
  'sort=onHand&dir=desc&page=3',
  'sort=updatedAt&dir=desc&page=1',
  'category=led&sort=name&page=20',
  'category=driver&sort=onHand&page=2',
  'q=white&sort=name&page=4',
  'q=700&category=driver&page=1',
  'below=1&sort=name&page=1',
  'tracking=unit&sort=category&page=2',
  'q=solder&sort=reorderPoint&dir=desc&page=1',
];

async function partsCase(member: Session | null) {
  say('## Parts table page (`GET /api/parts?…`, 10,000 parts, sorted and filtered in PostgreSQL)');
  say();
  const missing = member ? await routeMissing(`${APP}/api/parts?${PARTS_QUERIES[0]}`, { headers: { cookie: member.cookie } }) : 'no app server given';
  if (missing) {
    say(`Skipped: ${missing}.`);
    say();
    return;
  }
  const t: Target = { label: 'product', origin: APP, method: 'GET', request: (i) => ({ path: `/api/parts?pageSize=50&${PARTS_QUERIES[i % PARTS_QUERIES.length]}`, headers: { cookie: member!.cookie } }) };
  say(`${PARTS_QUERIES.length} different queries in turn (${PARTS_QUERIES.slice(0, 3).join(' · ')} …), 50 rows a page.`);
  say();
  const [max] = await runCase([t], MAX);
  const steady = await load({ ...t, label: `product, steady ${STEADY_PARTS.rate}/s` }, STEADY_PARTS);
  table([{ ...max, label: 'product, max' }, steady]);
  say(`- p99 per page request at a steady ${STEADY_PARTS.rate}/s: **${steady.p99.toFixed(1)} ms** (target < 50 ms: ${verdict(steady.p99 < 50)}); at saturation: ${max.p99.toFixed(1)} ms`);
  say();
}

async function scanJsCase(member: Session | null) {
  say('## Scan page first-load JavaScript');
  say();
  const fromBuild = firstLoadFromManifests(DIST, '/(app)/scan/page');
  if (!fromBuild) {
    say(`Skipped: the build in ${DIST} has no /scan page yet.`);
    say();
    return;
  }
  const sizes: JsSize[] = [fromBuild];
  if (member) {
    const res = await fetch(`${APP}/scan`, { headers: { cookie: member.cookie } });
    if (res.ok) sizes.push(firstLoadFromHtml(DIST, await res.text()));
  }
  for (const s of sizes) say(`- ${s.source}: ${s.files} files, ${(s.rawBytes / 1024).toFixed(0)} kB raw, **${(s.gzipBytes / 1024).toFixed(1)} kB gzipped**`);
  const worst = Math.max(...sizes.map((s) => s.gzipBytes));
  say(`- target ≤ 250 kB gzipped: ${verdict(worst <= 250 * 1024)}`);
  say();
}

/** Runs one of the stand-alone bench scripts and puts its output in the report as it printed it. */
function script(title: string, file: string, { node = [] as string[], args = [] as string[] } = {}) {
  say(`## ${title} (\`${[file, ...args].join(' ')}\`)`);
  say();
  const r = spawnSync(process.execPath, [...node, '--import', 'tsx', file, ...args], { cwd: ROOT, encoding: 'utf8', timeout: 300_000 });
  say('```');
  for (const line of `${r.stdout}${r.stderr}`.trimEnd().split('\n')) say(line);
  say('```');
  say(r.status === 0 ? '' : `(exit ${r.status ?? r.signal}: a target missed or the script failed)`);
  say();
}

async function header() {
  const v = await pool.query<{ version: string; fsync: string; sc: string }>(
    `select split_part(version(), ' ', 2) as version, current_setting('fsync') as fsync, current_setting('synchronous_commit') as sc`,
  );
  const { version, fsync, sc } = v.rows[0];
  const cpu = os.cpus();
  say(`# Ohmstead benchmark figures`);
  say();
  say(`Run ${new Date().toISOString().replace(/\.\d+Z$/, 'Z')} on ${cpu[0]?.model ?? 'unknown CPU'} × ${cpu.length} cores, ${(os.totalmem() / 2 ** 30).toFixed(1)} GB RAM, Node ${process.version}, PostgreSQL ${version} (fsync=${fsync}, synchronous_commit=${sc}).`);
  say(`Everything on loopback on this one machine (load generator included); production build in ${DIST}; shelf of ${fixture.parts.toLocaleString('en')} parts in one space.`);
  say(`Baselines measured in the same run: the framework floor (a bare route handler in the same build running the same SQL, no sign-in, validation or scoping) and the raw floor (node:http + pg, same SQL).`);
  say();
}

async function main() {
  await header();
  const members = APP ? await signInAll(fixture.members.map((m) => m.email)) : [];
  const member = members[0] ?? null;
  await lookupCase(member);
  await borrowCase(members);
  await partsCase(member);
  await scanJsCase(member);
  // One naive pass per string is plenty: it is the slow side of the ratio by a wide margin.
  script('Suggestions: "what works with this" on 10,000 parts, ranked vs naive', 'bench/suggest.ts', { args: ['--naive-runs', '1'] });
  script('Label PDF, 1,000 labels', 'bench/labels.ts', { node: ['--expose-gc'] });
  const out = path.join(ROOT, 'bench/out/latest.md');
  mkdirSync(path.dirname(out), { recursive: true });
  writeFileSync(out, `${report.join('\n')}\n`);
  console.log(`\nfigures written to ${path.relative(ROOT, out)}`);
}

main()
  .catch((err) => {
    console.error('bench failed:', err);
    process.exitCode = 1;
  })
  .finally(() => pool.end());
