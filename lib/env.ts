import { z } from 'zod';

// Environment read once and validated: a missing variable is a clear start-up error.
const schema = z.object({
  DATABASE_URL: z.string().url(),
  NEXTAUTH_SECRET: z.string().min(16, 'set NEXTAUTH_SECRET to a long random string'),
  NEXTAUTH_URL: z.string().url().default('http://127.0.0.1:3000'),
  APP_BASE_URL: z.string().url().default('http://127.0.0.1:3000'),
  SMTP_HOST: z.string().default('127.0.0.1'),
  SMTP_PORT: z.coerce.number().int().positive().default(2525),
  MAIL_FROM: z.string().default('Ohmstead <bench@ohmstead.invalid>'),
  MAILBOX_URL: z.string().url().default('http://127.0.0.1:2580'),
  OHM_DEV_MAILBOX: z.enum(['0', '1']).default('0'),
  STRIPE_SECRET_KEY: z.string().default('sk_test_ohmstead_local'),
  STRIPE_WEBHOOK_SECRET: z.string().default('whsec_ohmstead_local_dev_secret'),
  PAYMENTS_API_HOST: z.string().default('127.0.0.1'),
  PAYMENTS_API_PORT: z.coerce.number().int().positive().default(12111),
  PAYMENTS_API_PROTOCOL: z.enum(['http', 'https']).default('http'),
  // Tests move the clock (overdue loans) by setting this offset; never set in production.
  OHM_CLOCK_OFFSET_MS: z.coerce.number().int().default(0),
  OHM_TEST_HOOKS: z.enum(['0', '1']).default('0'),
});

export type Env = z.infer<typeof schema>;
let cached: Env | undefined;

export function env(): Env {
  if (cached) return cached;
  const parsed = schema.safeParse(process.env);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `  ${i.path.join('.')}: ${i.message}`).join('\n');
    throw new Error(`Ohmstead cannot start: check these environment variables:\n${lines}`);
  }
  cached = parsed.data;
  return cached;
}
