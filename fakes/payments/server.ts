// The payments fake: a stateful node:http server speaking the subset of the processor's REST API the
// app uses, so the official SDK works against it unchanged (only host, port and protocol differ).
import { randomBytes } from 'node:crypto';
import http, { type IncomingMessage, type ServerResponse } from 'node:http';
import type { AddressInfo } from 'node:net';
import { apiRoutes, type Route } from './api';
import { expireOverdueSessions } from './checkout';
import type { Ctx, RequestInfo } from './context';
import { applyChaos, controlRoutes, describeDelivery } from './control';
import { ApiError, unauthenticated } from './errors';
import { parseForm, type FormObject } from './form';
import { findReplay, remember } from './idempotency';
import { parseAnyBody, pathSegment, readBody, sendJson } from './http';
import { showPayPage, submitPayPage } from './paypage';
import { emptyState, loadState, saveState, type Chaos, type State } from './state';
import { DEFAULT_RETRY, WebhookDispatcher, type RetryPolicy, type WebhookTarget } from './webhooks';

export type PaymentsFakeOptions = {
  port?: number; // 0 picks a free port
  host?: string;
  webhookUrl?: string | null;
  webhookSecret: string;
  stateFile?: string;
  chaos?: Partial<Chaos>;
  /** Base of the pay-page links in checkout sessions; defaults to the fake's own address. */
  publicUrl?: string;
  /** Accept only this key; otherwise any test-mode key (`sk_test_…`, `rk_test_…`) is accepted. */
  apiKey?: string;
  retry?: Partial<RetryPolicy>;
};

export type PaymentsFake = {
  url: string;
  port: number;
  close(): Promise<void>;
  setChaos(chaos: Partial<Chaos>): Chaos;
  setWebhook(url: string | null, secret?: string): void;
  deliveries(): ReturnType<typeof describeDelivery>[];
  flushDeliveries(): void;
};

const TEST_KEY = /^(sk|rk)_test_[A-Za-z0-9_]+$/;

function apiKeyOf(req: IncomingMessage, expected?: string): string {
  const header = req.headers.authorization ?? '';
  let key = '';
  if (/^Bearer /i.test(header)) key = header.slice(7).trim();
  else if (/^Basic /i.test(header))
    key = Buffer.from(header.slice(6), 'base64').toString('utf8').split(':')[0];
  if (!key) {
    throw unauthenticated('You did not provide an API key. Send it as `Authorization: Bearer sk_test_...`.');
  }
  if (expected ? key !== expected : !TEST_KEY.test(key)) {
    const shown = key.length > 12 ? `${key.slice(0, 8)}${'*'.repeat(8)}${key.slice(-4)}` : '****';
    throw unauthenticated(
      `Invalid API Key provided: ${shown} (the payments fake takes test-mode keys only).`,
    );
  }
  return key;
}

type Found = { route: Route; match: string[] };

function findRoute(routes: Route[], method: string, path: string): Found {
  for (const route of routes) {
    const m = route.pattern.exec(path);
    if (m && route.method === method) return { route, match: m.map(pathSegment) };
  }
  throw new ApiError(404, 'invalid_request_error', `Unrecognized request URL (${method}: ${path}).`);
}

export async function startPaymentsFake(options: PaymentsFakeOptions): Promise<PaymentsFake> {
  const host = options.host ?? '127.0.0.1';
  const initial = emptyState({ duplicate: 1, shuffle: false, ...options.chaos });
  const loaded = loadState(options.stateFile, initial);
  if (options.chaos) loaded.chaos = { ...loaded.chaos, ...options.chaos };
  const target: WebhookTarget = { url: options.webhookUrl ?? null, secret: options.webhookSecret };
  const retry: RetryPolicy = { ...DEFAULT_RETRY, ...options.retry };

  const ctx: Ctx = {
    state: loaded,
    now: () => Math.floor(Date.now() / 1000) + ctx.state.clockOffsetSeconds,
    publicUrl: '',
    request: null,
    apiVersion: null,
    onEvent: (event) => dispatcher.enqueue(event),
  };
  const save = () => saveState(options.stateFile, ctx.state);
  const dispatcher = new WebhookDispatcher(() => ctx.state, target, retry, save);
  const reset = () => {
    ctx.state = emptyState({ duplicate: 1, shuffle: false, ...options.chaos });
  };
  const control = controlRoutes({ dispatcher, target, reset });

  /** Runs one API route; a thrown ApiError becomes its status and error body. */
  function run(
    found: Found,
    params: FormObject,
    path: string,
    request: RequestInfo,
  ): { status: number; body: unknown } {
    ctx.request = request;
    try {
      return { status: 200, body: found.route.handle(ctx, params, found.match, path) };
    } catch (err) {
      if (err instanceof ApiError) return { status: err.status, body: err.body() };
      throw err;
    } finally {
      ctx.request = null;
    }
  }

  function handleApi(req: IncomingMessage, res: ServerResponse, url: URL, body: string): void {
    const apiKey = apiKeyOf(req, options.apiKey);
    const method = req.method ?? 'GET';
    const found = findRoute(apiRoutes, method, url.pathname);
    const params = parseForm(method === 'GET' ? url.search.slice(1) : body);
    const version = req.headers['stripe-version'];
    if (typeof version === 'string') ctx.apiVersion = version;
    const requestId = `req_${randomBytes(10).toString('hex')}`;
    const key = method === 'POST' ? req.headers['idempotency-key'] : undefined;
    if (typeof key !== 'string') {
      const { status, body: answer } = run(found, params, url.pathname, {
        id: requestId,
        idempotency_key: null,
      });
      return sendJson(res, status, answer, { 'Request-Id': requestId });
    }
    const headers = { 'Request-Id': requestId, 'Idempotency-Key': key };
    const call = { apiKey, key, method, path: url.pathname, params };
    const saved = findReplay(ctx.state, call);
    if (saved) return sendJson(res, saved.status, saved.body, { ...headers, 'Idempotent-Replayed': 'true' });
    const { status, body: answer } = run(found, params, url.pathname, {
      id: requestId,
      idempotency_key: key,
    });
    remember(ctx.state, call, status, answer);
    sendJson(res, status, answer, headers);
  }

  async function handle(req: IncomingMessage, res: ServerResponse): Promise<void> {
    const url = new URL(req.url ?? '/', 'http://fake.local');
    const method = req.method ?? 'GET';
    const body = method === 'GET' ? '' : await readBody(req);
    const expired = expireOverdueSessions(ctx);
    try {
      const payPath = /^\/pay\/([^/]+)$/.exec(url.pathname);
      if (url.pathname.startsWith('/v1/')) {
        handleApi(req, res, url, body);
      } else if (payPath && method === 'GET') {
        showPayPage(ctx, res, pathSegment(payPath[1]));
      } else if (payPath && method === 'POST') {
        submitPayPage(ctx, res, pathSegment(payPath[1]), parseForm(body));
      } else {
        // Anything else must be a control route (findRoute answers 404 otherwise).
        const found = findRoute(control, method, url.pathname);
        const params = method === 'GET' ? parseForm(url.search.slice(1)) : parseAnyBody(req, body);
        sendJson(res, 200, found.route.handle(ctx, params, found.match, url.pathname));
      }
    } finally {
      if (method !== 'GET' || expired > 0) save();
    }
  }

  const server = http.createServer((req, res) => {
    handle(req, res).catch((err: unknown) => {
      if (res.headersSent) return res.destroy();
      if (err instanceof ApiError) return sendJson(res, err.status, err.body());
      console.error('payments fake: unexpected error', err);
      sendJson(
        res,
        500,
        new ApiError(500, 'api_error', 'The payments fake hit an unexpected error.').body(),
        { 'Stripe-Should-Retry': 'false' },
      );
    });
  });
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(options.port ?? 12111, host, () => resolve());
  });
  const port = (server.address() as AddressInfo).port;
  const url = `http://${host.includes(':') ? `[${host}]` : host}:${port}`;
  ctx.publicUrl = (options.publicUrl ?? url).replace(/\/$/, '');

  // Sessions also expire while nobody asks; deliveries owed from before a restart resume now.
  const sweeper = setInterval(() => expireOverdueSessions(ctx) > 0 && save(), 15_000);
  sweeper.unref();
  dispatcher.kick();

  return {
    url,
    port,
    async close() {
      clearInterval(sweeper);
      await dispatcher.stop();
      save();
      server.closeAllConnections();
      await new Promise<void>((resolve) => server.close(() => resolve()));
    },
    setChaos: (chaos) => applyChaos(ctx, chaos),
    setWebhook(webhookUrl, secret) {
      target.url = webhookUrl;
      if (secret) target.secret = secret;
      dispatcher.kick();
    },
    deliveries: () => ctx.state.deliveries.map((d) => describeDelivery(ctx, d)),
    flushDeliveries: () => dispatcher.flush(),
  };
}

export type { Chaos, State };
