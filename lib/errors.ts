// Typed errors thrown by services; lib/http/errors.ts maps them to HTTP answers.
export type FieldErrors = Record<string, string[]>;

export class AppError extends Error {
  constructor(
    readonly code: 'invalid' | 'unauthenticated' | 'forbidden' | 'not_found' | 'conflict' | 'unavailable' | 'too_many',
    message: string,
    readonly fields?: FieldErrors,
  ) {
    super(message);
    this.name = 'AppError';
  }
}

export class InvalidError extends AppError {
  constructor(message: string, fields?: FieldErrors) {
    super('invalid', message, fields);
  }
}
export class UnauthenticatedError extends AppError {
  constructor(message = 'Sign in first.') {
    super('unauthenticated', message);
  }
}
export class ForbiddenError extends AppError {
  constructor(message = 'Your role does not allow this.') {
    super('forbidden', message);
  }
}
export class NotFoundError extends AppError {
  constructor(message = 'Not found.') {
    super('not_found', message);
  }
}
export class ConflictError extends AppError {
  constructor(message: string, fields?: FieldErrors) {
    super('conflict', message, fields);
  }
}
export class UnavailableError extends AppError {
  constructor(message = 'A service we depend on is unavailable; try again shortly.') {
    super('unavailable', message);
  }
}
export class TooManyError extends AppError {
  constructor(message = 'Too many attempts; wait a little and try again.') {
    super('too_many', message);
  }
}
