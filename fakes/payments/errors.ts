// The processor's error envelope: `{ error: { type, code, message, param } }` with a matching HTTP status.
// The SDK picks its error class from the status (400/404 invalid request or idempotency, 401 auth, 402 card).
import type { z } from 'zod';
import { bracketPath } from './form';

export type ErrorType = 'invalid_request_error' | 'idempotency_error' | 'card_error' | 'api_error';

export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly type: ErrorType,
    message: string,
    readonly code: string | null = null,
    readonly param: string | null = null,
    readonly extra: Record<string, unknown> = {},
  ) {
    super(message);
  }

  body() {
    return {
      error: { type: this.type, code: this.code, message: this.message, param: this.param, ...this.extra },
    };
  }
}

export const invalid = (message: string, param: string | null = null, code: string | null = null) =>
  new ApiError(400, 'invalid_request_error', message, code, param);

export const missing = (object: string, id: string, param = 'id') =>
  new ApiError(404, 'invalid_request_error', `No such ${object}: '${id}'`, 'resource_missing', param);

export const unauthenticated = (message: string) => new ApiError(401, 'invalid_request_error', message);

/**
 * Turns a zod issue into the processor's wording, naming the param in bracket notation. An unknown
 * param is reported first: it is usually a misspelling of the param another issue says is missing.
 */
export function fromZod(error: z.ZodError): ApiError {
  const issue = error.issues.find((i) => i.code === 'unrecognized_keys') ?? error.issues[0];
  const path = bracketPath(issue.path);
  if (issue.code === 'unrecognized_keys') {
    const param = path ? `${path}[${issue.keys[0]}]` : issue.keys[0];
    return invalid(`Received unknown parameter: ${param}`, param, 'parameter_unknown');
  }
  if (issue.code === 'invalid_type' && issue.input === undefined) {
    return invalid(`Missing required param: ${path}.`, path, 'parameter_missing');
  }
  return invalid(`Invalid ${path}: ${issue.message}`, path, 'parameter_invalid');
}
