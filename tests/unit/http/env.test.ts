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

// A real space (npm run serve, OHM_PRODUCTION=1): no defaults for where it is reached, mailed from and paid.
describe('lib/env.ts for a real space', () => {
  const real = {
    ...base,
    NODE_ENV: 'production',
    OHM_PRODUCTION: '1',
    NEXTAUTH_SECRET: 'x'.repeat(40),
    APP_BASE_URL: 'https://bench.example.org',
    SMTP_HOST: 'mail.example.org',
    SMTP_PORT: '587',
    MAIL_FROM: 'Bench <bench@example.org>',
    BACKUP_DIR: '/var/backups/ohmstead',
  };

  it('accepts a complete env file', () => {
    expect(parseEnv(real).APP_BASE_URL).toBe('https://bench.example.org');
  });

  it('names every missing variable at once', () => {
    const e: Record<string, string | undefined> = { ...real };
    for (const name of ['APP_BASE_URL', 'SMTP_HOST', 'MAIL_FROM', 'BACKUP_DIR', 'STRIPE_SECRET_KEY']) delete e[name];
    let message = '';
    try {
      parseEnv(e);
    } catch (err) {
      message = (err as Error).message;
    }
    for (const name of ['APP_BASE_URL', 'SMTP_HOST', 'MAIL_FROM', 'BACKUP_DIR', 'STRIPE_SECRET_KEY']) expect(message).toContain(`${name}:`);
    expect(message).not.toContain('SMTP_PORT');
  });

  it('refuses the demo processor key, a short secret, a test door and one half of the SMTP sign-in', () => {
    expect(() => parseEnv({ ...real, STRIPE_SECRET_KEY: 'sk_test_ohmstead_local' })).toThrow(/STRIPE_SECRET_KEY: this is the demo/);
    expect(() => parseEnv({ ...real, NEXTAUTH_SECRET: 'only-twenty-characters' })).toThrow(/NEXTAUTH_SECRET: use at least 32/);
    expect(() => parseEnv({ ...real, OHM_TEST_HOOKS: '1' })).toThrow(/OHM_TEST_HOOKS: must not be set/);
    expect(() => parseEnv({ ...real, SMTP_USER: 'bench' })).toThrow(/SMTP_PASSWORD/);
    expect(parseEnv({ ...real, SMTP_USER: 'bench', SMTP_PASSWORD: 'relay-password', SMTP_TLS: 'starttls' }).SMTP_TLS).toBe('starttls');
  });

  it('asks nothing more of the demo (no OHM_PRODUCTION)', () => {
    expect(parseEnv({ ...base, NODE_ENV: 'production' }).APP_BASE_URL).toBe('http://127.0.0.1:3000');
  });
});
