// HTTP load for bench/: one autocannon run against one target, reduced to the figures we print.
import autocannon from 'autocannon';

export type Target = {
  label: string;
  /** Origin of the server, e.g. http://127.0.0.1:3000 */
  origin: string;
  method: 'GET' | 'POST';
  /** The i-th request: path, and for POST its JSON body; headers such as the session cookie. */
  request: (i: number) => { path: string; body?: unknown; headers?: Record<string, string> };
};

export type Figures = {
  label: string;
  /** 2xx answers per second over the run. */
  rps: number;
  p50: number;
  p99: number;
  ok: number;
  other: Record<string, number>;
  errors: number;
  seconds: number;
};

export type Shape = { connections: number; duration?: number; amount?: number; rate?: number };

export async function load(t: Target, shape: Shape): Promise<Figures> {
  let i = 0;
  const result = await autocannon({
    url: t.origin,
    connections: shape.connections,
    // autocannon rejects a duration key with no value: pass either a duration or an amount.
    ...(shape.amount ? { amount: shape.amount } : { duration: shape.duration ?? 10 }),
    ...(shape.rate ? { overallRate: shape.rate } : {}),
    timeout: 10,
    requests: [
      {
        method: t.method,
        setupRequest: (req) => {
          const r = t.request(i++);
          const headers: Record<string, string> = { ...req.headers, ...r.headers };
          if (r.body !== undefined) headers['content-type'] = 'application/json';
          return { ...req, method: t.method, path: r.path, headers, body: r.body === undefined ? undefined : JSON.stringify(r.body) };
        },
      },
    ],
  });
  const other: Record<string, number> = {};
  for (const [status, { count }] of Object.entries(result.statusCodeStats)) if (!status.startsWith('2')) other[status] = count;
  return {
    label: t.label,
    rps: result['2xx'] / result.duration,
    p50: result.latency.p50,
    p99: result.latency.p99,
    ok: result['2xx'],
    other,
    errors: result.errors + result.timeouts,
    seconds: result.duration,
  };
}

/** A short run whose figures are thrown away: JIT, connection pools and caches warm for the real one. */
export async function warm(t: Target, seconds = 2): Promise<void> {
  await load(t, { connections: 4, duration: seconds });
}

const f0 = (n: number) => (Number.isFinite(n) ? n.toFixed(0) : '–');
const f1 = (n: number) => (Number.isFinite(n) ? n.toFixed(1) : '–');

/** One markdown table row: target, 2xx/s, p50, p99, answers that were not 2xx. */
export function row(f: Figures): string {
  const other = Object.entries(f.other)
    .map(([s, n]) => `${n} × ${s}`)
    .concat(f.errors ? [`${f.errors} errors`] : [])
    .join(', ');
  return `| ${f.label} | ${f0(f.rps)} | ${f1(f.p50)} | ${f1(f.p99)} | ${f.ok} in ${f1(f.seconds)} s | ${other || 'none'} |`;
}

export const TABLE_HEAD = ['| target | 2xx / s | p50 ms | p99 ms | answered 2xx | not 2xx |', '|---|---:|---:|---:|---:|---|'];
