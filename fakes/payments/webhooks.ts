// Webhook delivery: every event is POSTed as JSON to the endpoint, signed the documented way
// (`Stripe-Signature: t=<unix>,v1=<hex HMAC-SHA256(secret, "<t>.<body>")>`), at least once: a non-2xx
// answer or a connection error is retried with exponential backoff. The queue lives in the state, so a
// restart resumes what is still owed. Chaos mode sends each event several times and out of order.
import { createHmac, randomUUID } from 'node:crypto';
import http from 'node:http';
import https from 'node:https';
import { publicJson } from './http';
import type { ApiObject, Delivery, State } from './state';

export type WebhookTarget = { url: string | null; secret: string };
export type RetryPolicy = { baseMs: number; maxMs: number; maxAttempts: number; timeoutMs: number };

// 1 s, 2 s, 4 s … then every 5 minutes: about two hours of retries before a delivery is marked failed.
export const DEFAULT_RETRY: RetryPolicy = {
  baseMs: 1_000,
  maxMs: 5 * 60_000,
  maxAttempts: 30,
  timeoutMs: 5_000,
};

export function signatureHeader(
  secret: string,
  payload: string,
  timestamp = Math.floor(Date.now() / 1000),
): string {
  const v1 = createHmac('sha256', secret).update(`${timestamp}.${payload}`, 'utf8').digest('hex');
  return `t=${timestamp},v1=${v1}`;
}

type PostResult = { status: number | null; error: string | null };

function post(
  url: string,
  body: string,
  headers: Record<string, string>,
  timeoutMs: number,
  track: (r: http.ClientRequest) => void,
): Promise<PostResult> {
  return new Promise((resolve) => {
    const target = new URL(url);
    const client = target.protocol === 'https:' ? https : http;
    const req = client.request(
      target,
      {
        method: 'POST',
        agent: false,
        timeout: timeoutMs,
        headers: { ...headers, 'Content-Length': String(Buffer.byteLength(body)), Connection: 'close' },
      },
      (res) => {
        res.resume();
        res.on('end', () => resolve({ status: res.statusCode ?? null, error: null }));
        res.on('error', (e) => resolve({ status: res.statusCode ?? null, error: e.message }));
      },
    );
    req.on('timeout', () => req.destroy(new Error(`no answer within ${timeoutMs} ms`)));
    req.on('error', (e) => resolve({ status: null, error: e.message }));
    track(req);
    req.end(body);
  });
}

/** A random order that is guaranteed not to keep the events in creation order (when there are two or more). */
function outOfOrder(batch: Delivery[], rank: (d: Delivery) => number): Delivery[] {
  const shuffled = [...batch];
  for (let i = shuffled.length - 1; i > 0; i--) {
    const j = Math.floor(Math.random() * (i + 1));
    [shuffled[i], shuffled[j]] = [shuffled[j], shuffled[i]];
  }
  const inOrder = shuffled.every((d, i) => i === 0 || rank(shuffled[i - 1]) <= rank(d));
  return inOrder ? shuffled.reverse() : shuffled;
}

export class WebhookDispatcher {
  private timer: NodeJS.Timeout | null = null;
  private running = false;
  private again = false;
  private stopped = false;
  private inFlight: http.ClientRequest | null = null;
  private current: Promise<void> | null = null;

  constructor(
    private readonly getState: () => State,
    private readonly target: WebhookTarget,
    private readonly retry: RetryPolicy,
    private readonly save: () => void,
  ) {}

  enqueue(event: ApiObject): void {
    const state = this.getState();
    if (!this.target.url) return;
    const copies = Math.max(1, state.chaos.duplicate);
    for (let copy = 1; copy <= copies; copy++) {
      state.deliveries.push({
        id: `whd_${randomUUID()}`,
        eventId: event.id,
        copy,
        attempts: 0,
        status: 'pending',
        nextAttemptAt: Date.now(),
        lastStatus: null,
        lastError: null,
        deliveredAt: null,
      });
    }
    event.pending_webhooks = copies;
    this.kick();
  }

  /** Sends every delivery not yet accepted now, failed ones included (one more attempt each). */
  flush(): void {
    for (const d of this.getState().deliveries) {
      if (d.status === 'delivered') continue;
      d.status = 'pending';
      d.nextAttemptAt = Date.now();
    }
    this.kick();
  }

  kick(delayMs?: number): void {
    if (this.stopped) return;
    if (this.running) {
      this.again = true;
      return;
    }
    if (this.timer) clearTimeout(this.timer);
    // In shuffle mode wait a moment, so events from neighbouring requests mix in one batch.
    const delay = delayMs ?? (this.getState().chaos.shuffle ? 50 : 0);
    this.timer = setTimeout(() => void this.tick(), delay);
  }

  /** Stops delivering; resolves once the batch in progress has let go (the caller saves the state). */
  async stop(): Promise<void> {
    this.stopped = true;
    if (this.timer) clearTimeout(this.timer);
    this.inFlight?.destroy();
    await this.current;
  }

  private tick(): Promise<void> {
    this.timer = null;
    this.current = this.deliverDue()
      .catch((err: unknown) => console.error('payments fake: webhook delivery failed unexpectedly', err))
      .finally(() => (this.current = null));
    return this.current;
  }

  private async deliverDue(): Promise<void> {
    this.running = true;
    try {
      const state = this.getState();
      const now = Date.now();
      let batch = state.deliveries.filter((d) => d.status === 'pending' && d.nextAttemptAt <= now);
      if (state.chaos.shuffle) {
        const order = new Map(Object.keys(state.events).map((id, i) => [id, i]));
        batch = outOfOrder(batch, (d) => order.get(d.eventId) ?? 0);
      }
      for (const delivery of batch) {
        await this.attempt(delivery);
        if (this.stopped) return;
        this.save();
      }
    } finally {
      this.running = false;
    }
    this.scheduleNext();
  }

  private scheduleNext(): void {
    if (this.stopped) return;
    if (this.again) {
      this.again = false;
      this.kick();
      return;
    }
    const pending = this.getState().deliveries.filter((d) => d.status === 'pending');
    if (pending.length === 0) return;
    const next = Math.min(...pending.map((d) => d.nextAttemptAt));
    this.kick(Math.max(0, next - Date.now()));
  }

  private async attempt(delivery: Delivery): Promise<void> {
    const state = this.getState();
    const event = state.events[delivery.eventId];
    if (!event || !this.target.url) {
      delivery.status = 'failed';
      delivery.lastError = event ? 'no webhook URL configured' : 'event no longer exists';
      return;
    }
    const body = publicJson(event, 2);
    delivery.attempts += 1;
    const result = await post(
      this.target.url,
      body,
      {
        'Content-Type': 'application/json; charset=utf-8',
        'User-Agent': 'ohmstead-payments-fake/1.0',
        'Stripe-Signature': signatureHeader(this.target.secret, body),
      },
      this.retry.timeoutMs,
      (r) => (this.inFlight = r),
    );
    this.inFlight = null;
    delivery.lastStatus = result.status;
    delivery.lastError = result.error;
    if (result.status !== null && result.status >= 200 && result.status < 300) {
      delivery.status = 'delivered';
      delivery.deliveredAt = Date.now();
      event.pending_webhooks = Math.max(0, (event.pending_webhooks as number) - 1);
    } else if (delivery.attempts >= this.retry.maxAttempts) {
      delivery.status = 'failed';
    } else {
      const backoff = Math.min(this.retry.baseMs * 2 ** (delivery.attempts - 1), this.retry.maxMs);
      delivery.nextAttemptAt = Date.now() + backoff;
    }
  }
}
