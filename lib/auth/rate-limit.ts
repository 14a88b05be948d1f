import 'server-only';
import pg from 'pg';
import { RateLimiterPostgres, RateLimiterRes } from 'rate-limiter-flexible';
import { env } from '@/lib/env';

// Sign-in attempts are counted in PostgreSQL so every app instance shares the count.
// Table rate_limits is created by the first migration.
const globalForLimiter = globalThis as unknown as { ohmSignInLimiter?: RateLimiterPostgres; ohmLinkLimiter?: RateLimiterPostgres };

function pool() {
  const p = new pg.Pool({ connectionString: env().DATABASE_URL, max: 2, connectionTimeoutMillis: 3_000 });
  p.on('error', () => undefined);
  return p;
}

/** 8 failed password attempts per e-mail per 15 minutes. */
export function signInLimiter(): RateLimiterPostgres {
  return (globalForLimiter.ohmSignInLimiter ??= new RateLimiterPostgres({
    storeClient: pool(),
    storeType: 'pool',
    tableName: 'rate_limits',
    tableCreated: true,
    keyPrefix: 'signin',
    points: 8,
    duration: 15 * 60,
  }));
}

/** 5 sign-in links per e-mail per 15 minutes: the mailbox is not a spam target. */
export function linkLimiter(): RateLimiterPostgres {
  return (globalForLimiter.ohmLinkLimiter ??= new RateLimiterPostgres({
    storeClient: pool(),
    storeType: 'pool',
    tableName: 'rate_limits',
    tableCreated: true,
    keyPrefix: 'link',
    points: 5,
    duration: 15 * 60,
  }));
}

/** Consumes one point; returns false when the key is over its limit. */
export async function take(limiter: RateLimiterPostgres, key: string): Promise<boolean> {
  try {
    await limiter.consume(key.toLowerCase());
    return true;
  } catch (err) {
    if (err instanceof RateLimiterRes) return false;
    throw err;
  }
}

export async function remaining(limiter: RateLimiterPostgres, key: string): Promise<number> {
  const res = await limiter.get(key.toLowerCase());
  return res ? Math.max(0, limiter.points - res.consumedPoints) : limiter.points;
}
