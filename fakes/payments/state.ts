// Everything the fake knows, as one JSON-serialisable value, so a restart from the state file resumes
// exactly where it stopped (objects, idempotency replays, webhook deliveries still owed).
import { randomBytes } from 'node:crypto';
import { existsSync, mkdirSync, readFileSync, renameSync, writeFileSync } from 'node:fs';
import path from 'node:path';

export type Metadata = Record<string, string>;
/** Every object the API returns carries these. */
export type ApiObject = {
  id: string;
  object: string;
  created: number;
  livemode: false;
  [key: string]: unknown;
};

export type IdempotencyRecord = {
  method: string;
  path: string;
  fingerprint: string;
  status: number;
  body: unknown;
  savedAt: number; // ms since epoch, real time
};

export type Delivery = {
  id: string;
  eventId: string;
  copy: number; // 1-based copy number when chaos duplicates an event
  attempts: number;
  status: 'pending' | 'delivered' | 'failed';
  nextAttemptAt: number; // ms since epoch, real time
  lastStatus: number | null;
  lastError: string | null;
  deliveredAt: number | null;
};

export type Chaos = { duplicate: number; shuffle: boolean };

export type Collections = {
  sessions: Record<string, ApiObject>;
  lineItems: Record<string, ApiObject[]>; // by checkout session id
  paymentIntents: Record<string, ApiObject>;
  charges: Record<string, ApiObject>;
  refunds: Record<string, ApiObject>;
  balanceTransactions: Record<string, ApiObject>;
  payouts: Record<string, ApiObject>;
  events: Record<string, ApiObject>;
};

export type State = Collections & {
  version: 1;
  clockOffsetSeconds: number;
  idempotency: Record<string, IdempotencyRecord>;
  deliveries: Delivery[];
  chaos: Chaos;
};

export function emptyState(chaos: Chaos = { duplicate: 1, shuffle: false }): State {
  return {
    version: 1,
    clockOffsetSeconds: 0,
    sessions: {},
    lineItems: {},
    paymentIntents: {},
    charges: {},
    refunds: {},
    balanceTransactions: {},
    payouts: {},
    events: {},
    idempotency: {},
    deliveries: [],
    chaos,
  };
}

const ALPHABET = '0123456789ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz';

/** `pi_` + 24 random base-62 characters; checkout sessions get `cs_test_` like test-mode ones. */
export function newId(prefix: string, length = 24): string {
  const bytes = randomBytes(length);
  let out = '';
  for (const b of bytes) out += ALPHABET[b % ALPHABET.length];
  return `${prefix}_${out}`;
}

export function loadState(file: string | undefined, fallback: State): State {
  if (!file || !existsSync(file)) return fallback;
  const parsed = JSON.parse(readFileSync(file, 'utf8')) as State;
  if (parsed.version !== 1) throw new Error(`payments fake: unknown state file version in ${file}`);
  return { ...emptyState(), ...parsed };
}

/** Write to a temporary file in the same folder, then rename over the old one: a crash never leaves half a file. */
export function saveState(file: string | undefined, state: State): void {
  if (!file) return;
  mkdirSync(path.dirname(file), { recursive: true });
  const tmp = `${file}.${process.pid}.tmp`;
  writeFileSync(tmp, JSON.stringify(state));
  renameSync(tmp, file);
}
