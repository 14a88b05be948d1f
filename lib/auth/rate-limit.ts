import 'server-only';
import pg from 'pg';
import { RateLimiterPostgres, RateLimiterRes } from 'rate-limiter-flexible';
import { env } from '@/lib/env';

// Sign-in link requests are counted in PostgreSQL so every app instance shares the count (password
// attempts: lib/auth/throttle.ts).
// Table rate_limits is created by the first migration.
const globalForLimiter = globalThis as unknown as { ohmLinkLimiter?: RateLimiterPostgres };

function pool() {
  const p = new pg.Pool({ connectionString: env().DATABASE_URL, max: 2, connectionTimeoutMillis: 3_000 });
  p.on('error', () => undefined);
  return p;
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
