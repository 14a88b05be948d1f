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
  });

export type Env = z.infer<typeof schema>;
let cached: Env | undefined;

/** Parses an environment (process.env by default); throws an error naming every bad variable. */
export function parseEnv(source: Record<string, string | undefined>): Env {
  const parsed = schema.safeParse(source);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `  ${i.path.join('.')}: ${i.message}`).join('\n');
    throw new Error(`Ohmstead cannot start: check these environment variables:\n${lines}`);
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
