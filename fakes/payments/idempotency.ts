// Idempotent requests: the first answer for a key is kept (24 hours, like the real API) and replayed
// for the same method, path and params; the same key with anything else is an idempotency_error.
import { createHash } from 'node:crypto';
import { ApiError } from './errors';
import type { FormObject } from './form';
import type { IdempotencyRecord, State } from './state';

const KEEP_MS = 24 * 60 * 60 * 1000;

export type Call = { apiKey: string; key: string; method: string; path: string; params: FormObject };

/** Same params in any key order give the same fingerprint. */
function fingerprint(value: unknown): string {
  const canonical = (v: unknown): unknown => {
    if (Array.isArray(v)) return v.map(canonical);
    if (v && typeof v === 'object') {
      const o = v as Record<string, unknown>;
      return Object.fromEntries(
        Object.keys(o)
          .sort()
          .map((k) => [k, canonical(o[k])]),
      );
    }
    return v;
  };
  return createHash('sha256')
    .update(JSON.stringify(canonical(value)))
    .digest('hex');
}

// Keys belong to an account: the same key sent with another API key is another request.
const slot = (call: Call) => `${call.apiKey}\u0000${call.key}`;

/** The stored answer to replay, if this key was used before; throws when it was used differently. */
export function findReplay(state: State, call: Call): IdempotencyRecord | undefined {
  if (call.key.length > 255) {
    throw new ApiError(
      400,
      'invalid_request_error',
      'Idempotency keys can be at most 255 characters long.',
      null,
      'Idempotency-Key',
    );
  }
  const saved = state.idempotency[slot(call)];
  if (!saved || Date.now() - saved.savedAt > KEEP_MS) return undefined;
  if (
    saved.method !== call.method ||
    saved.path !== call.path ||
    saved.fingerprint !== fingerprint(call.params)
  ) {
    throw new ApiError(
      400,
      'idempotency_error',
      `Keys for idempotent requests can only be used with the same parameters they were first used with. Try using a key other than '${call.key}' if you meant to execute a different request.`,
    );
  }
  return saved;
}

/** Like the real API, an answer is kept once the endpoint ran; a request refused by validation is not. */
export function remember(state: State, call: Call, status: number, body: unknown): void {
  if (status >= 400 && status !== 402) return;
  const now = Date.now();
  for (const [k, r] of Object.entries(state.idempotency))
    if (now - r.savedAt > KEEP_MS) delete state.idempotency[k];
  state.idempotency[slot(call)] = {
    method: call.method,
    path: call.path,
    fingerprint: fingerprint(call.params),
    status,
    body: structuredClone(body),
    savedAt: now,
  };
}
