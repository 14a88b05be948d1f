import { describe, expect, it } from 'vitest';
import { parseEnv } from '@/lib/env';

// Finding 2: settings fail closed. No secret has a built-in value; in production a missing session
// secret, processor key or webhook secret stops the start with an error naming the variable.
const base = {
  DATABASE_URL: 'postgres://postgres@127.0.0.1:5432/ohmstead',
  NEXTAUTH_SECRET: 'a-session-secret-long-enough',
  STRIPE_SECRET_KEY: 'sk_test_configured',
  STRIPE_WEBHOOK_SECRET: 'whsec_configured',
};

describe('lib/env.ts', () => {
  it('accepts a complete production environment', () => {
    expect(parseEnv({ ...base, NODE_ENV: 'production' }).STRIPE_WEBHOOK_SECRET).toBe('whsec_configured');
  });

  it.each(['NEXTAUTH_SECRET', 'STRIPE_SECRET_KEY', 'STRIPE_WEBHOOK_SECRET'])(
    'in production a missing %s is a start-up error naming it',
    (name) => {
      const e: Record<string, string | undefined> = { ...base, NODE_ENV: 'production' };
      delete e[name];
      expect(() => parseEnv(e)).toThrow(new RegExp(`${name}`));
      expect(() => parseEnv({ ...e, [name]: '' })).toThrow(new RegExp(`${name}`));
    },
  );

  it('has no printed fallback for the processor key or the webhook secret', () => {
    const e = parseEnv({ DATABASE_URL: base.DATABASE_URL, NEXTAUTH_SECRET: base.NEXTAUTH_SECRET, NODE_ENV: 'development' });
    expect(e.STRIPE_SECRET_KEY).toBeUndefined();
    expect(e.STRIPE_WEBHOOK_SECRET).toBeUndefined();
  });

  it('refuses a short session secret in any mode', () => {
    expect(() => parseEnv({ ...base, NEXTAUTH_SECRET: 'short' })).toThrow(/NEXTAUTH_SECRET/);
  });
});
