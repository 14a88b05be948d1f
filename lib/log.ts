import { AsyncLocalStorage } from 'node:async_hooks';
import { randomUUID } from 'node:crypto';
import pino from 'pino';
import { rawEnv } from '@/lib/env';
import { APP_VERSION } from '@/lib/version';

// The app's log: one JSON object per line on stdout (pino), each carrying the request id of the request
// (or scheduled job run) it belongs to, so a monitor or `journalctl -o cat | grep <id>` finds every line
// of one request. Route handlers get their id in lib/http/route.ts; jobs in their runners.

type Scope = { requestId: string };
const scope = new AsyncLocalStorage<Scope>();
const LEVELS = new Set(['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent']);
// Read raw (lib/env.ts validates it at start): a logger must not be the thing that throws on bad settings.
const level = rawEnv().LOG_LEVEL;

export const log = pino({
  level: level && LEVELS.has(level) ? level : 'info',
  base: { app: 'ohmstead', version: APP_VERSION },
  timestamp: pino.stdTimeFunctions.isoTime,
  mixin: () => ({ requestId: scope.getStore()?.requestId ?? 'none' }),
  // Never log a credential even if one ends up in an object handed to the logger.
  redact: { paths: ['password', '*.password', 'token', '*.token', 'headers.cookie', 'headers.authorization'], censor: '[redacted]' },
});

const ID = /^[A-Za-z0-9._:-]{8,100}$/;
/** The caller's X-Request-Id when it is a plain token (a proxy's id), else a new one. */
export function requestIdFrom(incoming: string | null | undefined): string {
  return incoming && ID.test(incoming) ? incoming : randomUUID();
}

/** Runs `fn` with every log line inside it (awaits included) carrying this request id. */
export function withRequestId<T>(requestId: string, fn: () => T): T {
  return scope.run({ requestId }, fn);
}

/** Runs one scheduled job's run with its own id (`job-<uuid>`) on every line it writes. */
export function withJobRunId<T>(fn: () => T): T {
  return withRequestId(`job-${randomUUID()}`, fn);
}

/** The current request id, if any (for answers that should name it). */
export function currentRequestId(): string | undefined {
  return scope.getStore()?.requestId;
}
