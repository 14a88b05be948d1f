// Where the way in spends its time: the production build started again under Node's own sampling profiler
// (`node --cpu-prof`), loaded for a few seconds with one case (the signed-in scan lookup, then the borrow),
// stopped with SIGTERM (Next's server exits, Node writes the profile), and summed up through the build's
// source maps so that every sample is charged to the file it was written in (lib/auth/guard.ts,
// node_modules/kysely/…), not to a minified chunk. Prints, per case, the share of each package and of our
// own folders, our functions by inclusive time, and the top functions by self time; writes the same to
// bench/out/profile.md and the raw .cpuprofile files beside it (open them in Chromium's DevTools).
// scripts/bench.sh runs it with `--profile`; env as for bench/run.ts (DATABASE_URL, BENCH_FIXTURE,
// BENCH_DIST_DIR, APP_BASE_URL's secret and settings in the environment of the build).
import { spawn, type ChildProcess } from 'node:child_process';
import { copyFileSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { SourceMap } from 'node:module';
import net from 'node:net';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import pg from 'pg';
import { closeBenchLoans as closeBench, signInCookie } from './bench-session';
import type { Fixture } from './data';
import { load, warm, type Target } from './load';

const ROOT = path.resolve(__dirname, '..');
const DIST = process.env.BENCH_DIST_DIR ?? '.next-bench';
const SECONDS = Number(process.env.BENCH_PROFILE_SECONDS ?? 10);
const fixture = JSON.parse(readFileSync(process.env.BENCH_FIXTURE ?? 'bench/out/fixture.json', 'utf8')) as Fixture;
const OUT = path.join(ROOT, 'bench/out');

const report: string[] = [];
const say = (line = '') => {
  console.log(line);
  report.push(line);
};

// ---- the profiled server

async function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const s = net.createServer();
    s.once('error', reject);
    s.listen(0, '127.0.0.1', () => {
      const { port } = s.address() as net.AddressInfo;
      s.close(() => resolve(port));
    });
  });
}

async function waitHttp(url: string, seconds: number) {
  const until = Date.now() + seconds * 1000;
  while (Date.now() < until) {
    try {
      const r = await fetch(url);
      await r.arrayBuffer();
      if (r.status < 500) return;
    } catch {
      // not listening yet
    }
    await new Promise((r) => setTimeout(r, 250));
  }
  throw new Error(`${url} did not answer within ${seconds} s`);
}

async function profiledServer(dir: string): Promise<{ origin: string; stop: () => Promise<string> }> {
  const port = await freePort();
  const origin = `http://127.0.0.1:${port}`;
  // The cookie's origin check compares with APP_BASE_URL: the profiled server is told its own address.
  const env = { ...process.env, OHM_DIST_DIR: DIST, APP_BASE_URL: origin, NEXTAUTH_URL: origin };
  const child: ChildProcess = spawn(
    process.execPath,
    ['--cpu-prof', `--cpu-prof-dir=${dir}`, '--cpu-prof-interval=250', 'node_modules/next/dist/bin/next', 'start', '-p', String(port), '-H', '127.0.0.1'],
    { cwd: ROOT, env, stdio: ['ignore', 'ignore', 'inherit'] },
  );
  const exited = new Promise<void>((r) => child.once('exit', () => r()));
  await waitHttp(`${origin}/signin`, 120);
  return {
    origin,
    stop: async () => {
      child.kill('SIGTERM');
      await exited;
      const file = readdirSync(dir).find((f) => f.endsWith('.cpuprofile'));
      if (!file) throw new Error(`no .cpuprofile written in ${dir}`);
      return path.join(dir, file);
    },
  };
}

// ---- reading a profile

type CallFrame = { functionName: string; url: string; lineNumber: number; columnNumber: number };
type ProfileNode = { id: number; callFrame: CallFrame; children?: number[] };
type CpuProfile = { nodes: ProfileNode[]; samples: number[]; timeDeltas: number[]; startTime: number; endTime: number };

type Place = { fn: string; file: string; line: number; bucket: string };

const maps = new Map<string, SourceMap | null>();
function sourceMapOf(file: string): SourceMap | null {
  if (!maps.has(file)) {
    try {
      maps.set(file, new SourceMap(JSON.parse(readFileSync(`${file}.map`, 'utf8'))));
    } catch {
      maps.set(file, null);
    }
  }
  return maps.get(file)!;
}

/** A bundler's source name (turbopack:///[project]/lib/x.ts, …/node_modules/kysely/…) as a path in the repo. */
function repoPath(source: string): string {
  const s = decodeURIComponent(source)
    .replace(/^turbopack:\/\/\/?/, '')
    .replace(/^\[project\]\//, '')
    .replace(/^file:\/\//, '');
  const nm = s.lastIndexOf('node_modules/');
  if (nm >= 0) return s.slice(nm);
  // Turbopack names the project's files relative to the chunk (../../../lib/x.ts).
  return s.startsWith(ROOT) ? path.relative(ROOT, s) : s.replace(/^(\.\.\/)+/, '');
}

/** Ours (the top folder), a package (node_modules/<name>), Node's own code, or the engine's entries. */
function bucketOf(file: string, fn: string): string {
  if (!file) return fn.startsWith('(') ? fn : '(native)';
  if (file.startsWith('node:')) return 'node: (Node.js internals)';
  const nm = file.match(/node_modules\/((?:@[^/]+\/)?[^/]+)/);
  if (nm) {
    // Next.js ships React, its server runtime and more pre-compiled under next/dist/compiled/<name>.
    const compiled = file.match(/next\/dist\/compiled\/((?:@[^/]+\/)?[^/]+)/);
    return compiled ? `next (compiled ${compiled[1]})` : nm[1];
  }
  const top = file.split('/')[0];
  return ['app', 'lib', 'db', 'labels', 'components'].includes(top) ? `ours: ${top}/` : file;
}

function placeOf(cf: CallFrame): Place {
  let file = cf.url.startsWith('file://') ? fileURLToPath(cf.url) : cf.url;
  let line = cf.lineNumber + 1;
  let fn = cf.functionName || '(anonymous)';
  if (file.endsWith('.js') && file.includes(`${path.sep}${DIST.replace(/^\.\//, '')}${path.sep}`)) {
    const entry = sourceMapOf(file)?.findEntry(cf.lineNumber, cf.columnNumber) as
      | { originalSource?: string; originalLine?: number; name?: string }
      | undefined;
    if (entry?.originalSource) {
      file = repoPath(entry.originalSource);
      line = (entry.originalLine ?? 0) + 1;
      if (entry.name && (fn === '(anonymous)' || fn.length <= 2)) fn = entry.name;
    } else file = path.relative(ROOT, file);
  } else if (file.startsWith(ROOT)) file = path.relative(ROOT, file);
  return { fn, file, line, bucket: bucketOf(file, fn) };
}

type Summary = { totalMs: number; busyMs: number; buckets: [string, number][]; self: [string, number][]; oursInclusive: [string, number][] };

/**
 * Sums the samples taken while the load ran (`window`, wall-clock ms). The profile's clock is not the wall
 * clock: its end is taken as the moment the process was seen to exit, and 200 ms are left out at each edge.
 */
function summarise(profile: CpuProfile, window: { from: number; to: number; exitAt: number }): Summary {
  const parent = new Map<number, number>();
  for (const n of profile.nodes) for (const c of n.children ?? []) parent.set(c, n.id);
  const places = new Map(profile.nodes.map((n) => [n.id, placeOf(n.callFrame)]));
  const selfMs = new Map<number, number>();
  let t = profile.startTime;
  profile.samples.forEach((id, i) => {
    const dt = profile.timeDeltas[i] ?? 0;
    t += dt;
    const wall = window.exitAt - (profile.endTime - t) / 1000;
    if (wall < window.from + 200 || wall > window.to - 200) return;
    selfMs.set(id, (selfMs.get(id) ?? 0) + dt / 1000);
  });

  const buckets = new Map<string, number>();
  const self = new Map<string, number>();
  const inclusive = new Map<string, number>();
  let totalMs = 0;
  let idleMs = 0;
  for (const [id, ms] of selfMs) {
    const p = places.get(id)!;
    totalMs += ms;
    if (p.fn === '(idle)') idleMs += ms;
    buckets.set(p.bucket, (buckets.get(p.bucket) ?? 0) + ms);
    const key = `${p.fn} — ${p.file || '(engine)'}${p.file ? `:${p.line}` : ''}`;
    self.set(key, (self.get(key) ?? 0) + ms);
    // Inclusive time of our own functions: every distinct one of ours on this sample's stack.
    const seen = new Set<string>();
    for (let at: number | undefined = id; at !== undefined; at = parent.get(at)) {
      const q = places.get(at)!;
      if (!q.bucket.startsWith('ours')) continue;
      const k = `${q.fn} — ${q.file}:${q.line}`;
      if (seen.has(k)) continue;
      seen.add(k);
      inclusive.set(k, (inclusive.get(k) ?? 0) + ms);
    }
  }
  const top = (m: Map<string, number>, n: number) => [...m].sort((a, b) => b[1] - a[1]).slice(0, n);
  return { totalMs, busyMs: totalMs - idleMs, buckets: top(buckets, 14), self: top(self, 20), oursInclusive: top(inclusive, 15) };
}

function printSummary(name: string, served: number, s: Summary) {
  const pct = (ms: number) => `${((100 * ms) / s.busyMs).toFixed(1)} %`;
  say(`### ${name}`);
  say();
  const perAnswer = s.busyMs / Math.max(served * (s.totalMs / 1000 / SECONDS), 1);
  say(`${served.toLocaleString('en')} answers in ${SECONDS} s; in the ${(s.totalMs / 1000).toFixed(1)} s sampled the server process was busy ${(s.busyMs / 1000).toFixed(1)} s (the rest idle, waiting on PostgreSQL and the network): about ${perAnswer.toFixed(2)} ms of CPU per answer. Shares below are of the busy time.`);
  say();
  say('| where (source maps applied) | CPU | share |');
  say('|---|---:|---:|');
  for (const [b, ms] of s.buckets) if (b !== '(idle)') say(`| ${b} | ${ms.toFixed(0)} ms | ${pct(ms)} |`);
  say();
  say('Our functions by inclusive time (with everything they call):');
  say();
  say('| function — file:line | inclusive | share |');
  say('|---|---:|---:|');
  for (const [k, ms] of s.oursInclusive) say(`| ${k} | ${ms.toFixed(0)} ms | ${pct(ms)} |`);
  say();
  say('Top functions by self time:');
  say();
  say('| function — file:line | self | share |');
  say('|---|---:|---:|');
  for (const [k, ms] of s.self) if (!k.startsWith('(idle)')) say(`| ${k} | ${ms.toFixed(0)} ms | ${pct(ms)} |`);
  say();
}

// ---- the cases

async function closeBenchLoans() {
  const pool = new pg.Pool({ connectionString: process.env.DATABASE_URL, max: 1 });
  try {
    await closeBench(pool, fixture.spaceId);
  } finally {
    await pool.end();
  }
}

async function profileCase(name: string, file: string, target: (origin: string, cookies: string[]) => Target) {
  const dir = mkdtempSync(path.join(os.tmpdir(), 'ohm-prof-'));
  const server = await profiledServer(dir);
  let served = 0;
  const window = { from: 0, to: 0, exitAt: 0 };
  try {
    const cookies: string[] = [];
    // Borrows spread over 30 members, each far under the open-loan limit in 10 s.
    for (const m of fixture.members.slice(0, 30)) cookies.push(await signInCookie(server.origin, m.email, fixture.password));
    const t = target(server.origin, cookies);
    await closeBenchLoans();
    await warm(t, 2);
    await closeBenchLoans();
    window.from = Date.now();
    const f = await load(t, { connections: 10, duration: SECONDS });
    window.to = Date.now();
    served = f.ok;
    if (f.errors || Object.keys(f.other).length) say(`(${name}: answers other than 2xx: ${JSON.stringify(f.other)}, ${f.errors} errors)`);
  } finally {
    const prof = await server.stop();
    window.exitAt = Date.now();
    copyFileSync(prof, path.join(OUT, file));
    printSummary(name, served, summarise(JSON.parse(readFileSync(prof, 'utf8')) as CpuProfile, window));
    await closeBenchLoans();
  }
}

async function main() {
  mkdirSync(OUT, { recursive: true });
  say(`## CPU profile of the way in (\`bench/profile.ts\`, ${new Date().toISOString().replace(/\.\d+Z$/, 'Z')})`);
  say();
  say(`The production build in ${DIST} under \`node --cpu-prof\` (250 µs sampling), 10 connections for ${SECONDS} s after 2 s of warm-up; only the samples taken while the load ran are counted (start-up and sign-ins are not).`);
  say();
  const code = (i: number) => encodeURIComponent(fixture.unitCodes[(i * 7919) % fixture.unitCodes.length]);
  await profileCase('Signed-in scan lookup (GET /api/scan/[code])', 'profile-lookup.cpuprofile', (origin, cookies) => ({
    label: 'lookup',
    origin,
    method: 'GET',
    request: (i) => ({ path: `/api/scan/${code(i)}`, headers: { cookie: cookies[0] } }),
  }));
  // The same lookup through the framework floor (no sign-in, validation or scoping): what is not ours.
  await profileCase('The framework floor of that lookup (GET /api/bench-floor/scan/[code])', 'profile-lookup-floor.cpuprofile', (origin) => ({
    label: 'floor',
    origin,
    method: 'GET',
    request: (i) => ({ path: `/api/bench-floor/scan/${code(i)}` }),
  }));
  const item = (i: number) => fixture.borrowables[(i * 31) % fixture.borrowables.length];
  await profileCase('Borrow of one counted item (POST /api/loans)', 'profile-borrow.cpuprofile', (origin, cookies) => ({
    label: 'borrow',
    origin,
    method: 'POST',
    request: (i) => ({ path: '/api/loans', headers: { cookie: cookies[i % cookies.length], origin }, body: { counted: [{ ...item(i), qty: 1 }] } }),
  }));
  await profileCase('The framework floor of that borrow (POST /api/bench-floor/loans)', 'profile-borrow-floor.cpuprofile', (origin) => ({
    label: 'floor',
    origin,
    method: 'POST',
    request: (i) => ({ path: '/api/bench-floor/loans', body: { spaceId: fixture.spaceId, borrowerId: fixture.members[i % 30].id, ...item(i) } }),
  }));
  writeFileSync(path.join(OUT, 'profile.md'), `${report.join('\n')}\n`);
  console.log(`\nsummary written to bench/out/profile.md; the .cpuprofile files beside it`);
}

main().catch((err) => {
  console.error('profile failed:', err);
  process.exitCode = 1;
});
