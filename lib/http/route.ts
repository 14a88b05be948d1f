import { NextResponse } from 'next/server';
import { z } from 'zod';
import type { Ctx } from '@/lib/auth/roles';
import type { Role } from '@/lib/domain';
import { env } from '@/lib/env';
import { AppError, ForbiddenError, InvalidError, NotFoundError } from '@/lib/errors';
import { idSchema } from '@/lib/ids';
import { log, requestIdFrom, withRequestId } from '@/lib/log';
import { errorBody, errorResponse, zodFields } from './respond';

/*
 * The one way into the app's HTTP API. Every app/api/** /route.ts exports handlers made by `route()`,
 * and every request runs the same steps in the same order — nothing else decides them:
 *
 *   1. origin     a state-changing method (POST, PUT, PATCH, DELETE) that carries a session cookie must
 *                 come from the app's own pages (Origin = APP_BASE_URL's origin, or
 *                 Sec-Fetch-Site: same-origin), else 403. Signature-authenticated routes skip this.
 *   2. session    `who` says who may call: 'anonymous' (anyone), 'signed-in', a list of roles (any one
 *                 held in the current space), or 'signature' (the service checks a signature). 401 / 403.
 *   3. params     path segments parsed with their zod schema; anything that does not parse names no
 *                 record: 404 (the same answer as another space's id).
 *   4. query      search parameters with zod: 400 naming the field.
 *   5. body       JSON routes require Content-Type application/json (else 415 naming the type sent),
 *                 then zod: 400 naming each field. Uploads require multipart/form-data and are cut off
 *                 at their byte limit while reading (413). Raw routes get the text (signatures).
 *   6. service    `run` calls the service with the caller's Ctx and the parsed input; handlers hold no
 *                 SQL and no role rules of their own.
 *   7. answer     a returned value is JSON with `status` (200 by default); a returned Response passes
 *                 through (CSV, PDF, calendar, streams). Any thrown typed error becomes
 *                 { error: { code, message, fields? } } with its status (lib/http/respond.ts).
 *
 * The declaration is also the API document: lib/http/openapi.ts turns every declared route into
 * OpenAPI 3.1, served at /api/openapi.json.
 */

export type Method = 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE';
export type Who = 'anonymous' | 'signed-in' | 'signature' | readonly [Role, ...Role[]];

/** Stewards and admins: who changes the shelf, kits and loans of others. */
export const STAFF = ['steward', 'admin'] as const satisfies readonly Role[];

/** The one path-id schema: `[id]` segments parse with this; a malformed id is a 404. */
export const idParams = z.object({ id: idSchema });

const STATE_CHANGING = new Set<Method>(['POST', 'PUT', 'PATCH', 'DELETE']);
const SESSION_COOKIE = /(?:^|;\s*)(?:__Secure-)?next-auth\.session-token(?:\.\d+)?=/;

type CtxFor<W extends Who> = W extends 'anonymous' | 'signature' ? null : Ctx;

/** What the body of a request is. */
export type BodyKind =
  /** application/json; `doc` documents a body whose parsing schema is a transform. */
  | { kind: 'json'; schema: z.ZodType; doc?: z.ZodType }
  /** multipart/form-data: `fields` validates the form (files as z.file()); read at most maxBytes. */
  | { kind: 'multipart'; schema: z.ZodType; maxBytes: number; doc?: z.ZodType }
  /** The raw text, for routes whose caller signs the exact bytes. */
  | { kind: 'text'; contentTypes: string[] }
  /** application/x-www-form-urlencoded, handed on unread (next-auth's own forms). */
  | { kind: 'form' };

export type RunInput<W extends Who, P, Q, B> = {
  req: Request;
  ctx: CtxFor<W>;
  params: P;
  query: Q;
  body: B;
  /** The untouched route context, for a handler that forwards the request (next-auth). */
  context: RouteContext;
};

export type RouteContext = { params: Promise<Record<string, string | string[]>> };

type Produces = { contentType: string; description: string };

export type RouteSpec<W extends Who, P extends z.ZodType, Q extends z.ZodType, B extends BodyKind | undefined> = {
  method: Method;
  /** One line for the API reference. */
  summary: string;
  description?: string;
  who: W;
  params?: P;
  /** What a malformed or unknown path id names, for the 404 message ("No such loan."). */
  notFound?: string;
  query?: Q;
  body?: B;
  /** Success status of a JSON answer (default 200). */
  status?: number;
  /** The JSON answer's schema (documentation; `run` returns it). */
  response?: z.ZodType;
  /** A non-JSON answer (CSV, PDF, calendar…): its content type, for the document. */
  produces?: Produces;
  run: (input: RunInput<W, z.output<P>, z.output<Q>, BodyOut<B>>) => Promise<unknown>;
};

type BodyOut<B> = B extends { kind: 'json'; schema: infer S extends z.ZodType }
  ? z.output<S>
  : B extends { kind: 'multipart'; schema: infer S extends z.ZodType }
    ? z.output<S>
    : B extends { kind: 'text' }
      ? string
      : undefined;

export type DeclaredSpec = RouteSpec<Who, z.ZodType, z.ZodType, BodyKind | undefined>;
export type RouteHandler = ((req: Request, context?: RouteContext) => Promise<Response>) & {
  readonly declaration: DeclaredSpec;
};

// ---- body kinds ------------------------------------------------------------------------------------

export const json = <S extends z.ZodType>(schema: S, doc?: z.ZodType) => ({ kind: 'json', schema, doc }) as const;
export const multipart = <S extends z.ZodType>(schema: S, maxBytes: number, doc?: z.ZodType) =>
  ({ kind: 'multipart', schema, maxBytes, doc }) as const;
export const rawText = (...contentTypes: string[]) => ({ kind: 'text', contentTypes }) as const;
export const urlencodedForm = () => ({ kind: 'form' }) as const;

// ---- the steps ---------------------------------------------------------------------------------------

function appOrigin(): string {
  return new URL(env().APP_BASE_URL).origin;
}

/** Step 1: a change carried by a session cookie comes from our own pages, or not at all. */
export function checkOrigin(req: Request): void {
  if (!SESSION_COOKIE.test(req.headers.get('cookie') ?? '')) return;
  if (req.headers.get('sec-fetch-site') === 'same-origin') return;
  const origin = req.headers.get('origin');
  if (origin && origin === appOrigin()) return;
  throw new ForbiddenError(
    `Refused: a change made with your session must come from Ohmstead's own pages at ${appOrigin()} ` +
      `(this request came from ${origin ? `origin ${origin}` : 'an unstated origin'}).`,
  );
}

/** Step 2, shared with server actions (lib/auth/action.ts). */
export async function resolveCaller<W extends Who>(who: W): Promise<CtxFor<W>> {
  if (who === 'anonymous' || who === 'signature') return null as CtxFor<W>;
  // Loaded on first use: public routes (and their in-process unit tests) never touch the session store.
  const { requireRole, requireUser } = await import('@/lib/auth/guard');
  if (who === 'signed-in') return (await requireUser()) as CtxFor<W>;
  return (await requireRole(...(who as readonly Role[]))) as CtxFor<W>;
}

function invalid(error: z.ZodError, where?: string): InvalidError {
  const fields = zodFields(error);
  const named = Object.keys(fields).join(', ');
  return new InvalidError(`Check ${where ? `${where} ` : ''}${named}.`, fields);
}

async function parseParams(spec: DeclaredSpec, context: RouteContext) {
  if (!spec.params) return undefined;
  const raw = await context.params;
  const parsed = spec.params.safeParse(raw ?? {});
  if (!parsed.success) throw new NotFoundError(`No such ${spec.notFound ?? 'record'}.`);
  return parsed.data;
}

function parseQuery(spec: DeclaredSpec, req: Request) {
  if (!spec.query) return undefined;
  const params: Record<string, string> = {};
  for (const [k, v] of new URL(req.url).searchParams) params[k] ??= v;
  const parsed = spec.query.safeParse(params);
  if (!parsed.success) throw invalid(parsed.error, 'the query');
  return parsed.data;
}

class UnsupportedType extends AppError {
  constructor(sent: string | null, wanted: string) {
    super('invalid', `Send the body as ${wanted}${sent ? `, not ${sent}` : ' with a Content-Type header'}.`, {
      'content-type': [`expected ${wanted}, got ${sent ?? 'none'}`],
    });
  }
}
/** 413: a body or file past its limit (the declaration's reader, or a service's own size rule). */
export class TooLarge extends AppError {
  constructor(maxBytes: number) {
    const limit = `${Math.round(maxBytes / 1024 / 1024)} MB`;
    super('invalid', `The request was refused: it is larger than ${limit}.`, { file: [`larger than ${limit}`] });
  }
}

const mediaType = (req: Request) => req.headers.get('content-type')?.split(';')[0].trim().toLowerCase() || null;

/** Reads at most `max` bytes of the body, whether or not Content-Length was sent (chunked uploads). */
async function readLimited(req: Request, max: number): Promise<Uint8Array<ArrayBuffer>> {
  const declared = Number(req.headers.get('content-length') ?? '0');
  if (declared > max) throw new TooLarge(max);
  if (!req.body) return new Uint8Array(new ArrayBuffer(0));
  const reader = req.body.getReader();
  const chunks: Uint8Array[] = [];
  let size = 0;
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    size += value.byteLength;
    if (size > max) {
      await reader.cancel().catch(() => {});
      throw new TooLarge(max);
    }
    chunks.push(value);
  }
  const out = new Uint8Array(new ArrayBuffer(size));
  let at = 0;
  for (const c of chunks) {
    out.set(c, at);
    at += c.byteLength;
  }
  return out;
}

async function parseBody(spec: DeclaredSpec, req: Request) {
  const body = spec.body;
  if (!body) return undefined;
  const type = mediaType(req);
  switch (body.kind) {
    case 'json': {
      const text = await req.text();
      // No body and no type: the schema decides whether an absent body is fine (optional bodies).
      if (type !== 'application/json' && !(type === null && text.length === 0))
        throw new UnsupportedType(type, 'application/json');
      let raw: unknown;
      try {
        raw = text.length ? JSON.parse(text) : undefined;
      } catch {
        throw new InvalidError('The body is not valid JSON.', { '(body)': ['not valid JSON'] });
      }
      const parsed = body.schema.safeParse(raw);
      if (!parsed.success) throw invalid(parsed.error);
      return parsed.data;
    }
    case 'multipart': {
      if (type !== 'multipart/form-data') throw new UnsupportedType(type, 'multipart/form-data');
      const bytes = await readLimited(req, body.maxBytes);
      let form: FormData;
      try {
        form = await new Response(bytes, { headers: { 'content-type': req.headers.get('content-type')! } }).formData();
      } catch {
        throw new InvalidError('The multipart body could not be read.', { '(body)': ['not valid multipart/form-data'] });
      }
      const parsed = body.schema.safeParse(Object.fromEntries(form.entries()));
      if (!parsed.success) throw invalid(parsed.error);
      return parsed.data;
    }
    case 'text': {
      if (!type || !body.contentTypes.includes(type)) throw new UnsupportedType(type, body.contentTypes.join(' or '));
      return req.text();
    }
    case 'form': {
      if (req.method !== 'GET' && type !== 'application/x-www-form-urlencoded')
        throw new UnsupportedType(type, 'application/x-www-form-urlencoded');
      return undefined;
    }
  }
}

const NO_PARAMS: RouteContext = { params: Promise.resolve({}) };
const STATUS_413 = (err: unknown) => err instanceof TooLarge;
const STATUS_415 = (err: unknown) => err instanceof UnsupportedType;

/** Declares one route handler. The exported name (GET, POST…) must equal `method`; a test checks it. */
export function route<
  W extends Who,
  P extends z.ZodType = z.ZodUndefined,
  Q extends z.ZodType = z.ZodUndefined,
  B extends BodyKind | undefined = undefined,
>(spec: RouteSpec<W, P, Q, B>): RouteHandler {
  const declared = spec as unknown as DeclaredSpec;
  // Every answer carries X-Request-Id, and every log line written while it is made carries the same id.
  const handler = (req: Request, context: RouteContext = NO_PARAMS): Promise<Response> => {
    const requestId = requestIdFrom(req.headers.get('x-request-id'));
    return withRequestId(requestId, async () => {
      const started = performance.now();
      const res = await answer(req, context);
      try {
        res.headers.set('x-request-id', requestId);
      } catch {
        // a Response with immutable headers (Response.redirect) keeps its own
      }
      log.info({ method: req.method, path: new URL(req.url).pathname, status: res.status, ms: Math.round(performance.now() - started) }, 'request');
      return res;
    });
  };
  const answer = async (req: Request, context: RouteContext): Promise<Response> => {
    try {
      if (STATE_CHANGING.has(declared.method) && declared.who !== 'signature') checkOrigin(req);
      const ctx = await resolveCaller(declared.who);
      const params = await parseParams(declared, context);
      const query = parseQuery(declared, req);
      const body = await parseBody(declared, req);
      const out = await declared.run({ req, ctx, params, query, body, context } as never);
      if (out instanceof Response) return out;
      return NextResponse.json(out ?? { ok: true }, { status: declared.status ?? 200 });
    } catch (err) {
      if (STATUS_415(err) || STATUS_413(err)) {
        const e = err as AppError;
        return NextResponse.json(errorBody(e.code, e.message, e.fields), { status: STATUS_415(err) ? 415 : 413 });
      }
      return errorResponse(err);
    }
  };
  return Object.assign(handler, { declaration: declared });
}
