import { z } from 'zod';

// Every environment variable the app reads, read here once and validated: a missing or malformed one is
// a start-up error naming it. Nothing else reads process.env (next.config.mjs, which runs before any of
// this at build time, is the one exception; a lint rule keeps it so).
//
// Secrets fail closed: there is no built-in session secret, processor key or webhook signing secret.
// In production (NODE_ENV=production, i.e. `next start`) all three must be set. Outside production a
// missing processor key or webhook secret leaves payments unconfigured: the webhook refuses every event.
const secret = (name: string) => z.string().min(16, `set ${name} to a long random string`);
const optionalSecret = z.preprocess((v) => (v === '' ? undefined : v), z.string().min(1).optional());
const flag = z.enum(['0', '1']).default('0');

const schema = z
  .object({
    NODE_ENV: z.enum(['development', 'production', 'test']).default('development'),
    DATABASE_URL: z.string().url(),
    NEXTAUTH_SECRET: secret('NEXTAUTH_SECRET'),
    NEXTAUTH_URL: z.string().url().default('http://127.0.0.1:3000'),
    APP_BASE_URL: z.string().url().default('http://127.0.0.1:3000'),
    SMTP_HOST: z.string().default('127.0.0.1'),
    SMTP_PORT: z.coerce.number().int().positive().default(2525),
    MAIL_FROM: z.string().default('Ohmstead <bench@ohmstead.invalid>'),
    // A real relay: sign in with these (both or neither), and how to wrap the connection in TLS.
    SMTP_USER: optionalSecret,
    SMTP_PASSWORD: optionalSecret,
    SMTP_TLS: z.enum(['none', 'starttls', 'implicit']).default('none'),
    MAILBOX_URL: z.string().url().default('http://127.0.0.1:2580'),
    OHM_DEV_MAILBOX: flag,
    STRIPE_SECRET_KEY: optionalSecret,
    STRIPE_WEBHOOK_SECRET: optionalSecret,
    PAYMENTS_API_HOST: z.string().default('127.0.0.1'),
    PAYMENTS_API_PORT: z.coerce.number().int().positive().default(12111),
    PAYMENTS_API_PROTOCOL: z.enum(['http', 'https']).default('http'),
    PAYMENTS_API_TIMEOUT_MS: z.coerce.number().int().positive().optional(),
    // Tests only: lets the suite move the app's clock and point a space at another payments port.
    OHM_TEST_HOOKS: flag,
    // npm run bench only: the framework-floor baseline routes answer.
    OHM_BENCH: flag,
    // Set to 0 to keep the scheduled jobs (reminder sweep) out of this process.
    OHM_JOBS: z.enum(['0', '1']).default('1'),
    // `npm run serve` (scripts/serve.sh) sets this: a real space, not the demo (see PRODUCTION_REQUIRED).
    OHM_PRODUCTION: flag,
    // Where `npm run serve` listens: 0.0.0.0 (or the machine's LAN address) behind the TLS front.
    APP_HOST: z.string().min(1).default('127.0.0.1'),
    APP_PORT: z.coerce.number().int().min(1).max(65535).default(3000),
    // Nightly backups go here (pg_dump custom format); `npm run serve` also backs up here before migrating.
    BACKUP_DIR: z.preprocess((v) => (v === '' ? undefined : v), z.string().optional()),
    // pino's level for the app's JSON log lines.
    LOG_LEVEL: z.enum(['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent']).default('info'),
    // How many proxies in front of the app append to X-Forwarded-For. 0 (no proxy): the sign-in throttle
    // takes the address of the connection itself and ignores the header, which the client can write. 1: the
    // entry the nearest proxy appended (lib/auth/throttle.ts sourceOf).
    TRUSTED_PROXY_HOPS: z.coerce.number().int().min(0).max(10).default(0),
    // Next's own: which runtime runs instrumentation.ts.
    NEXT_RUNTIME: z.string().optional(),
  })
  .superRefine((e, ctx) => {
    if (e.NODE_ENV !== 'production') return;
    for (const name of ['STRIPE_SECRET_KEY', 'STRIPE_WEBHOOK_SECRET'] as const) {
      if (!e[name]) ctx.addIssue({ code: 'custom', path: [name], message: `${name} is required in production` });
    }
    if (Boolean(e.SMTP_USER) !== Boolean(e.SMTP_PASSWORD)) {
      ctx.addIssue({ code: 'custom', path: [e.SMTP_USER ? 'SMTP_PASSWORD' : 'SMTP_USER'], message: 'set SMTP_USER and SMTP_PASSWORD together' });
    }
  });

// A real space (`npm run serve`, OHM_PRODUCTION=1) has no defaults for where it is reached, how it mails
// and how it is paid: each of these must be set in its env file, or the start stops naming it.
export const PRODUCTION_REQUIRED = [
  'DATABASE_URL',
  'NEXTAUTH_SECRET',
  'APP_BASE_URL',
  'SMTP_HOST',
  'SMTP_PORT',
  'MAIL_FROM',
  'STRIPE_SECRET_KEY',
  'STRIPE_WEBHOOK_SECRET',
  'BACKUP_DIR',
] as const;
// The values `npm start` and `npm test` use for the local fakes: never real keys.
const DEMO_VALUES: Record<string, string[]> = {
  STRIPE_SECRET_KEY: ['sk_test_ohmstead_local', 'sk_test_ohmstead_tests', 'sk_test_ohmstead_throwaway'],
  STRIPE_WEBHOOK_SECRET: ['whsec_ohmstead_local_dev_secret', 'whsec_ohmstead_tests_secret', 'whsec_ohmstead_throwaway_secret'],
};
// Doors and fakes a real space never opens.
const PRODUCTION_OFF = ['OHM_TEST_HOOKS', 'OHM_DEV_MAILBOX', 'OHM_BENCH', 'OHM_DEMO_MAILBOX'] as const;

/** What is wrong with a production environment, one line per variable (empty when it is complete). */
export function productionProblems(source: Record<string, string | undefined>): string[] {
  const problems: string[] = [];
  for (const name of PRODUCTION_REQUIRED) {
    if (!source[name]?.trim()) problems.push(`  ${name}: required for a real space (set it in the env file)`);
  }
  for (const [name, values] of Object.entries(DEMO_VALUES)) {
    if (values.includes(source[name] ?? '')) problems.push(`  ${name}: this is the demo's value; set your processor's real one`);
  }
  for (const name of PRODUCTION_OFF) {
    if (source[name] && source[name] !== '0') problems.push(`  ${name}: must not be set for a real space (it opens a demo or test door)`);
  }
  if (source.OHM_BUILD_DOORS?.trim()) problems.push('  OHM_BUILD_DOORS: must not be set for a real space (it builds test or dev doors in)');
  if ((source.NEXTAUTH_SECRET ?? '').length > 0 && (source.NEXTAUTH_SECRET ?? '').length < 32) {
    problems.push('  NEXTAUTH_SECRET: use at least 32 random characters (openssl rand -hex 32)');
  }
  return problems;
}

export type Env = z.infer<typeof schema>;
let cached: Env | undefined;

/** Parses an environment (process.env by default); throws an error naming every bad variable. */
export function parseEnv(source: Record<string, string | undefined>): Env {
  const parsed = schema.safeParse(source);
  const lines = parsed.success ? [] : parsed.error.issues.map((i) => `  ${i.path.join('.')}: ${i.message}`);
  if (source.OHM_PRODUCTION === '1') {
    for (const line of productionProblems(source)) {
      const name = line.trim().split(':')[0];
      if (!lines.some((l) => l.trim().startsWith(`${name}:`))) lines.push(line);
    }
  }
  if (!parsed.success || lines.length) {
    throw new Error(`Ohmstead cannot start: check these environment variables:\n${lines.join('\n')}`);
  }
  return parsed.data;
}

/**
 * The raw variables, for the few readers that must see a change made after start (tests that point the
 * mail reader at their own sink, the test clock) and for scripts that run outside the app.
 */
export function rawEnv(): Record<string, string | undefined> {
  return process.env;
}

export function env(): Env {
  return (cached ??= parseEnv(process.env));
}
