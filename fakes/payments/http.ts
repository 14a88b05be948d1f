// Small HTTP helpers for the fake: bodies, JSON/HTML answers, redirects.
import type { IncomingMessage, ServerResponse } from 'node:http';
import { ApiError } from './errors';
import { parseForm, type FormObject } from './form';

const MAX_BODY_BYTES = 1_000_000;

/** Strips the fake's private `_` fields; the same text is signed and sent. */
export function publicJson(value: unknown, space?: number): string {
  return JSON.stringify(value, (key, v) => (key.startsWith('_') ? undefined : v), space);
}

/** A path segment, decoded; a malformed escape is kept as typed (it then simply matches nothing). */
export function pathSegment(raw: string): string {
  try {
    return decodeURIComponent(raw);
  } catch {
    return raw;
  }
}

export async function readBody(req: IncomingMessage): Promise<string> {
  const chunks: Buffer[] = [];
  let size = 0;
  for await (const chunk of req) {
    size += (chunk as Buffer).length;
    if (size > MAX_BODY_BYTES) throw new ApiError(413, 'invalid_request_error', 'Request body too large.');
    chunks.push(chunk as Buffer);
  }
  return Buffer.concat(chunks).toString('utf8');
}

/** Control endpoints take JSON or a form; the API takes forms only (like the real one). */
export function parseAnyBody(req: IncomingMessage, text: string): FormObject {
  if (!text.trim()) return {};
  if ((req.headers['content-type'] ?? '').includes('application/json')) {
    try {
      return JSON.parse(text) as FormObject;
    } catch {
      throw new ApiError(400, 'invalid_request_error', 'The request body is not valid JSON.');
    }
  }
  return parseForm(text);
}

export function sendJson(
  res: ServerResponse,
  status: number,
  body: unknown,
  headers: Record<string, string> = {},
): void {
  const text = publicJson(body, 2);
  res.writeHead(status, {
    'Content-Type': 'application/json',
    'Content-Length': String(Buffer.byteLength(text)),
    ...headers,
  });
  res.end(text);
}

export function sendHtml(res: ServerResponse, status: number, html: string): void {
  res.writeHead(status, {
    'Content-Type': 'text/html; charset=utf-8',
    'Content-Length': String(Buffer.byteLength(html)),
  });
  res.end(html);
}

export function redirect(res: ServerResponse, location: string): void {
  res.writeHead(303, { Location: location, 'Content-Length': '0' });
  res.end();
}
