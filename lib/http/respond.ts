import { log } from '@/lib/log';
import { NextResponse } from 'next/server';
import { z } from 'zod';
import { AppError, type FieldErrors } from '@/lib/errors';

// One shape for every error answer: { error: { code, message, fields? } }.
const STATUS: Record<AppError['code'], number> = {
  invalid: 400,
  unauthenticated: 401,
  forbidden: 403,
  not_found: 404,
  conflict: 409,
  too_many: 429,
  unavailable: 503,
};

export function errorBody(code: string, message: string, fields?: FieldErrors) {
  return { error: { code, message, ...(fields ? { fields } : {}) } };
}

/** Turns zod issues into { 'a.b': ['message'] } with the dotted path of each field. */
export function zodFields(error: z.ZodError): FieldErrors {
  const fields: FieldErrors = {};
  for (const issue of error.issues) {
    const key = issue.path.length ? issue.path.map(String).join('.') : '(body)';
    // Own keys only: a field named `constructor` or `__proto__` must not reach Object.prototype.
    if (!Object.hasOwn(fields, key)) Object.defineProperty(fields, key, { value: [], enumerable: true, writable: true, configurable: true });
    fields[key].push(issue.message);
  }
  return fields;
}

/** PostgreSQL unreachable (restart, crash): answer 503 rather than 500. */
function isDatabaseDown(err: unknown): boolean {
  const e = err as { code?: string; message?: string } | null;
  if (!e) return false;
  if (e.code && ['ECONNREFUSED', 'ECONNRESET', '57P01', '57P02', '57P03', '08006', '08001', '08003'].includes(e.code))
    return true;
  return /Connection terminated|connect ECONNREFUSED|timeout exceeded when trying to connect|not queryable|terminating connection|the database system is (starting up|shutting down)|Client was closed/i.test(
    e.message ?? '',
  );
}

export function errorResponse(err: unknown): NextResponse {
  if (err instanceof AppError) {
    return NextResponse.json(errorBody(err.code, err.message, err.fields), { status: STATUS[err.code] });
  }
  if (err instanceof z.ZodError) {
    const fields = zodFields(err);
    return NextResponse.json(errorBody('invalid', `Check ${Object.keys(fields).join(', ')}.`, fields), {
      status: 400,
    });
  }
  if (isDatabaseDown(err)) {
    return NextResponse.json(errorBody('unavailable', 'The database is unavailable; try again shortly.'), {
      status: 503,
      headers: { 'Retry-After': '2' },
    });
  }
  log.error({ err }, 'unexpected error');
  return NextResponse.json(errorBody('internal', 'Something went wrong on our side.'), { status: 500 });
}

/** Reads and validates a JSON body; a malformed body is a 400 naming `(body)`. */
export async function parseJsonBody<T extends z.ZodType>(req: Request, schema: T): Promise<z.infer<T>> {
  let raw: unknown;
  try {
    const text = await req.text();
    raw = text.length ? JSON.parse(text) : undefined;
  } catch {
    throw new AppError('invalid', 'The body is not valid JSON.', { '(body)': ['not valid JSON'] });
  }
  const parsed = schema.safeParse(raw);
  if (!parsed.success) {
    const fields = zodFields(parsed.error);
    throw new AppError('invalid', `Check ${Object.keys(fields).join(', ')}.`, fields);
  }
  return parsed.data;
}

/** Validates search params the same way. */
export function parseQuery<T extends z.ZodType>(url: string | URL, schema: T): z.infer<T> {
  const params = Object.fromEntries(new URL(url).searchParams.entries());
  const parsed = schema.safeParse(params);
  if (!parsed.success) {
    const fields = zodFields(parsed.error);
    throw new AppError('invalid', `Check ${Object.keys(fields).join(', ')}.`, fields);
  }
  return parsed.data;
}

/** Wraps a route handler body: any thrown error becomes the JSON error answer. */
export function handle<A extends unknown[]>(fn: (...args: A) => Promise<Response>) {
  return async (...args: A): Promise<Response> => {
    try {
      return await fn(...args);
    } catch (err) {
      return errorResponse(err);
    }
  };
}
