import 'server-only';
import pg from 'pg';
import { RateLimiterPostgres } from 'rate-limiter-flexible';
import { env } from '@/lib/env';
import { PEER_HEADER } from './peer';

// Password sign-in throttling: growing waits, never a lock. Failed attempts are counted (in PostgreSQL,
// so every app instance shares the counts) for three keys, and each failure past a free allowance makes
// that key wait before its next attempt: 1 s, 2 s, 4 s … up to a ceiling.
//   e-mail + source address  — the guesser's own address slows down fast; the owner elsewhere is untouched;
//   source address alone      — one address trying many e-mails (credential stuffing) slows down;
//   e-mail alone              — a guesser spread over many addresses still only gets a trickle; its
//                               ceiling is one minute, so the owner is at worst made to wait, never kept out.
// Attempts refused while waiting are not counted, so hammering does not lengthen the wait. A correct
// password clears the e-mail + source count only: signing in to an account of one's own must not wipe
// an address's or an e-mail's record.

type Rule = { prefix: string; free: number; firstWaitSec: number; maxWaitSec: number };
const RULES = {
  pair: { prefix: 'pw-pair', free: 5, firstWaitSec: 1, maxWaitSec: 15 * 60 },
  source: { prefix: 'pw-source', free: 50, firstWaitSec: 2, maxWaitSec: 30 },
  email: { prefix: 'pw-email', free: 50, firstWaitSec: 1, maxWaitSec: 60 },
} satisfies Record<string, Rule>;
type Kind = keyof typeof RULES;
const KINDS = Object.keys(RULES) as Kind[];
/** Counts start again an hour after a key's first counted failure. */
const WINDOW_SEC = 60 * 60;

/** Seconds a key must wait after its `failures`-th failure (0 within the free allowance). */
export function waitAfter(rule: Rule, failures: number): number {
  if (failures <= rule.free) return 0;
  return Math.min(rule.firstWaitSec * 2 ** Math.min(failures - rule.free - 1, 30), rule.maxWaitSec);
}

type Limiters = { counts: Record<Kind, RateLimiterPostgres>; waits: RateLimiterPostgres };
const g = globalThis as unknown as { ohmPasswordThrottle?: Limiters };

function limiters(): Limiters {
  if (g.ohmPasswordThrottle) return g.ohmPasswordThrottle;
  const pool = new pg.Pool({ connectionString: env().DATABASE_URL, max: 3, connectionTimeoutMillis: 3_000 });
  pool.on('error', () => undefined);
  // Table rate_limits is created by the first migration.
  const make = (keyPrefix: string, points: number, duration: number) =>
    new RateLimiterPostgres({ storeClient: pool, storeType: 'pool', tableName: 'rate_limits', tableCreated: true, keyPrefix, points, duration });
  const counts = Object.fromEntries(KINDS.map((k) => [k, make(RULES[k].prefix, 1_000_000, WINDOW_SEC)])) as Record<Kind, RateLimiterPostgres>;
  // A wait is a block on this limiter for the wait's length.
  return (g.ohmPasswordThrottle = { counts, waits: make('pw-wait', 1, 1) });
}

/**
 * The address a request came from. The chain is the X-Forwarded-For entries followed by the connection's
 * own address (stamped by lib/auth/peer.ts); `hops` trusted proxies each appended one entry, so the
 * client is `hops` places from the end. With no proxy (0) that is the connection itself, whatever the
 * client wrote in the header. Without the stamp (a server other than `next start`), Next's own
 * X-Forwarded-For, which it sets from the connection when the client sent none, stands in for it.
 */
export function sourceOf(headers: Record<string, unknown> | undefined, hops: number = env().TRUSTED_PROXY_HOPS): string {
  const xff = String(headers?.['x-forwarded-for'] ?? '').split(',').map((s) => s.trim()).filter(Boolean);
  const peer = String(headers?.[PEER_HEADER] ?? '').trim();
  const chain = peer ? [...xff, peer] : xff;
  const picked = (chain[Math.max(0, chain.length - 1 - hops)] ?? '').toLowerCase();
  return (picked.startsWith('::ffff:') ? picked.slice(7) : picked).slice(0, 64) || 'unknown';
}

function keys(email: string, source: string): Record<Kind, string> {
  const e = email.trim().toLowerCase();
  return { pair: `${e}|${source}`, source, email: e };
}

/** Seconds until this e-mail may be tried from this source (0: go ahead). */
export async function secondsToWait(email: string, source: string): Promise<number> {
  const { waits } = limiters();
  const k = keys(email, source);
  const res = await Promise.all(KINDS.map((kind) => waits.get(`${kind}:${k[kind]}`)));
  const ms = Math.max(0, ...res.map((r) => (r && r.consumedPoints > waits.points ? r.msBeforeNext : 0)));
  return Math.ceil(ms / 1000);
}

/** Records a failed attempt and starts whatever waits it has earned. */
export async function recordFailure(email: string, source: string): Promise<void> {
  const { counts, waits } = limiters();
  const k = keys(email, source);
  await Promise.all(
    KINDS.map(async (kind) => {
      const res = await counts[kind].consume(k[kind]);
      const wait = waitAfter(RULES[kind], res.consumedPoints);
      if (wait > 0) await waits.block(`${kind}:${k[kind]}`, wait);
    }),
  );
}

/** A correct password: this e-mail from this source starts afresh. */
export async function recordSuccess(email: string, source: string): Promise<void> {
  const { counts, waits } = limiters();
  const pair = keys(email, source).pair;
  await Promise.all([counts.pair.delete(pair), waits.delete(`pair:${pair}`)]);
}
