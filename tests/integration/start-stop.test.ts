import { spawn, type ChildProcess } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, readdirSync, rmSync, chmodSync } from 'node:fs';
import net from 'node:net';
import path from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';

// `npm start` (scripts/start.sh) stops everything it started — the private PostgreSQL, the SMTP sink, the
// payments fake and the app — on Ctrl-C (SIGINT to the terminal's process group) and on SIGTERM to the
// script alone. The real script runs on a throwaway folder and free ports, serving the test run's build
// (OHM_START_PREBUILT) so nothing is built and the demo's own .data is never touched.
const ROOT = path.resolve(__dirname, '../..');
const STATE = mkdtempSync('/var/tmp/ohm-stop.');
chmodSync(STATE, 0o755); // the postgres OS user must reach its data folder inside

async function freePort(): Promise<number> {
  return new Promise((resolve) => {
    const s = net.createServer();
    s.listen(0, '127.0.0.1', () => {
      const { port } = s.address() as net.AddressInfo;
      s.close(() => resolve(port));
    });
  });
}

function portOpen(port: number): Promise<boolean> {
  return new Promise((resolve) => {
    const socket = net.connect({ port, host: '127.0.0.1' });
    socket.once('connect', () => (socket.destroy(), resolve(true)));
    socket.once('error', () => resolve(false));
  });
}

/** Every live process whose parent chain leads to `root` (read from /proc; zombies count as gone). */
function descendantsOf(root: number): number[] {
  const parent = new Map<number, number>();
  for (const name of readdirSync('/proc')) {
    if (!/^\d+$/.test(name)) continue;
    try {
      const stat = readFileSync(`/proc/${name}/stat`, 'utf8');
      const fields = stat.slice(stat.lastIndexOf(')') + 2).split(' ');
      if (fields[0] === 'Z') continue;
      parent.set(Number(name), Number(fields[1]));
    } catch {
      // the process ended while we read
    }
  }
  const out: number[] = [];
  for (const pid of parent.keys()) {
    for (let p = parent.get(pid); p !== undefined && p > 1; p = parent.get(p)) {
      if (p === root) {
        out.push(pid);
        break;
      }
    }
  }
  return out;
}

function alive(pid: number): boolean {
  try {
    const stat = readFileSync(`/proc/${pid}/stat`, 'utf8');
    return stat.slice(stat.lastIndexOf(')') + 2)[0] !== 'Z';
  } catch {
    return false;
  }
}

type Started = { script: ChildProcess; ports: number[]; pids: number[]; output: () => string };

async function startScript(): Promise<Started> {
  const [pg, app, smtp, smtpHttp, payments] = [await freePort(), await freePort(), await freePort(), await freePort(), await freePort()];
  const env: Record<string, string | undefined> = {
    ...process.env,
    OHM_STATE_DIR: STATE,
    OHM_PG_PORT: String(pg),
    OHM_APP_PORT: String(app),
    SMTP_PORT: String(smtp),
    SMTP_SINK_HTTP_PORT: String(smtpHttp),
    PAYMENTS_API_PORT: String(payments),
    OHM_START_PREBUILT: process.env.OHM_DIST_DIR ?? '.next-test',
  };
  delete env.OHM_DIST_DIR;
  // detached: the script leads its own process group, as a shell's foreground job does.
  const script = spawn('bash', [path.join(ROOT, 'scripts/start.sh')], { cwd: ROOT, env: env as NodeJS.ProcessEnv, detached: true, stdio: ['ignore', 'pipe', 'pipe'] });
  let out = '';
  script.stdout!.on('data', (d) => (out += d));
  script.stderr!.on('data', (d) => (out += d));
  const deadline = Date.now() + 240_000;
  while (!out.includes('Stop with Ctrl-C')) {
    if (script.exitCode !== null || Date.now() > deadline) throw new Error(`start.sh did not come up:\n${out}`);
    await new Promise((r) => setTimeout(r, 250));
  }
  const postmaster = Number(readFileSync(path.join(STATE, 'pg/postmaster.pid'), 'utf8').split('\n')[0]);
  const pids = [...descendantsOf(script.pid!), postmaster];
  return { script, ports: [pg, app, smtp, smtpHttp, payments], pids, output: () => out };
}

async function stoppedWithin(started: Started, send: () => void): Promise<number> {
  const t0 = Date.now();
  const exited = new Promise<void>((resolve) => started.script.once('exit', () => resolve()));
  send();
  await exited;
  // The script has returned: everything it started must already be gone, and its ports free.
  const elapsed = Date.now() - t0;
  return elapsed;
}

afterAll(() => {
  rmSync(STATE, { recursive: true, force: true });
});

describe('npm start stops everything it started', () => {
  it('on Ctrl-C (SIGINT to the process group): PostgreSQL, fakes and app gone, ports free', { timeout: 300_000 }, async () => {
    const started = await startScript();
    for (const port of started.ports) expect(await portOpen(port), `port ${port} open while running`).toBe(true);
    // The app, both fakes and PostgreSQL's server: at least four processes.
    expect(started.pids.length).toBeGreaterThanOrEqual(4);

    const ms = await stoppedWithin(started, () => process.kill(-started.script.pid!, 'SIGINT'));
    console.log(`start.sh stopped on SIGINT in ${ms} ms`);
    expect(ms).toBeLessThan(15_000);
    for (const pid of started.pids) expect(alive(pid), `process ${pid} still running after Ctrl-C\n${started.output()}`).toBe(false);
    for (const port of started.ports) expect(await portOpen(port), `port ${port} still open after Ctrl-C`).toBe(false);
    expect(existsSync(path.join(STATE, 'pg/postmaster.pid'))).toBe(false);
    expect(started.output()).toContain('stopping services');
  });

  it('on SIGTERM to the script alone (kill, a service manager): the same', { timeout: 300_000 }, async () => {
    const started = await startScript();
    for (const port of started.ports) expect(await portOpen(port)).toBe(true);

    const ms = await stoppedWithin(started, () => process.kill(started.script.pid!, 'SIGTERM'));
    console.log(`start.sh stopped on SIGTERM in ${ms} ms`);
    expect(ms).toBeLessThan(15_000);
    for (const pid of started.pids) expect(alive(pid), `process ${pid} still running after SIGTERM\n${started.output()}`).toBe(false);
    for (const port of started.ports) expect(await portOpen(port), `port ${port} still open after SIGTERM`).toBe(false);
    expect(existsSync(path.join(STATE, 'pg/postmaster.pid'))).toBe(false);
  });
});
