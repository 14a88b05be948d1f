import { createServer, type IncomingMessage, type Server, type ServerResponse } from 'node:http';
import { mailboxListPage, mailboxMessagePage } from './mailbox-page';
import type { MessageStore } from './store';

// The sink's small JSON API, read by tests and by the app's test-build mailbox page:
//   GET /health · GET /messages?to=<addr> (newest first) · GET /messages/:id · DELETE /messages
// and the dev mailbox for people, as HTML: GET / (every message) · GET /view/:id (one message).
export function createMailboxApi(store: MessageStore): Server {
  return createServer((req, res) => {
    route(store, req, res).catch((err: unknown) =>
      send(res, 500, { error: { code: 'internal', message: String(err) } }),
    );
  });
}

async function route(store: MessageStore, req: IncomingMessage, res: ServerResponse): Promise<void> {
  const url = new URL(req.url ?? '/', 'http://sink.invalid');
  const method = req.method ?? 'GET';
  const parts = url.pathname.split('/').filter(Boolean);

  if (parts.length === 0 || parts[0] === 'view') {
    if (method !== 'GET') return notAllowed(res, 'GET');
    if (parts.length === 0) return sendHtml(res, 200, mailboxListPage(store.list()));
    const message = parts.length === 2 ? store.get(decodeURIComponent(parts[1])) : undefined;
    if (!message) return sendHtml(res, 404, '<!doctype html><title>Not found</title><p>No message with that id. <a href="/">All mail</a></p>');
    return sendHtml(res, 200, mailboxMessagePage(message));
  }
  if (parts.length === 1 && parts[0] === 'health') {
    if (method !== 'GET') return notAllowed(res, 'GET');
    return send(res, 200, { ok: true, messages: store.list().length });
  }
  if (parts[0] !== 'messages' || parts.length > 2) {
    return send(res, 404, { error: { code: 'not_found', message: `No such path: ${url.pathname}` } });
  }
  if (parts.length === 1) {
    if (method === 'GET')
      return send(res, 200, { messages: store.list(url.searchParams.get('to') ?? undefined) });
    if (method === 'DELETE') {
      await store.clear();
      return send(res, 200, { ok: true });
    }
    return notAllowed(res, 'GET, DELETE');
  }
  if (method !== 'GET') return notAllowed(res, 'GET');
  const message = store.get(decodeURIComponent(parts[1]));
  if (!message) return send(res, 404, { error: { code: 'not_found', message: 'No message with that id.' } });
  return send(res, 200, message);
}

function notAllowed(res: ServerResponse, allow: string): void {
  res.setHeader('Allow', allow);
  send(res, 405, { error: { code: 'method_not_allowed', message: `Use ${allow}.` } });
}

function send(res: ServerResponse, status: number, body: unknown): void {
  const json = JSON.stringify(body);
  res.writeHead(status, { 'Content-Type': 'application/json; charset=utf-8', 'Cache-Control': 'no-store' });
  res.end(json);
}

function sendHtml(res: ServerResponse, status: number, html: string): void {
  res.writeHead(status, {
    'Content-Type': 'text/html; charset=utf-8',
    'Cache-Control': 'no-store',
    'X-Content-Type-Options': 'nosniff',
    // No script runs on these pages; links leave without a referrer.
    'Content-Security-Policy': "default-src 'none'; style-src 'unsafe-inline'; base-uri 'none'; form-action 'none'",
    'Referrer-Policy': 'no-referrer',
  });
  res.end(html);
}
