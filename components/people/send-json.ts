import type { FieldValues, Path, UseFormSetError } from 'react-hook-form';

// The browser side of our JSON routes: one error shape ({ error: { code, message, fields } }) in,
// field messages onto the form they came from.

export class ApiError extends Error {
  constructor(
    readonly status: number,
    message: string,
    readonly fields: Record<string, string[]> = {},
  ) {
    super(message);
  }
}

export async function sendJson<T>(
  url: string,
  method: 'POST' | 'PATCH' | 'DELETE',
  body?: unknown,
): Promise<T> {
  let res: Response;
  try {
    res = await fetch(url, {
      method,
      headers: body === undefined ? undefined : { 'content-type': 'application/json' },
      body: body === undefined ? undefined : JSON.stringify(body),
    });
  } catch {
    throw new ApiError(0, 'The server could not be reached. Check the connection and try again.');
  }
  const data = await res.json().catch(() => null);
  if (!res.ok) {
    throw new ApiError(
      res.status,
      data?.error?.message ?? `The server answered ${res.status}.`,
      data?.error?.fields ?? {},
    );
  }
  return data as T;
}

/** Puts each field message from the server under its field; returns the fields that had no input. */
export function applyFieldErrors<F extends FieldValues>(
  err: unknown,
  setError: UseFormSetError<F>,
  known: readonly string[],
): string[] {
  if (!(err instanceof ApiError)) return [];
  const unplaced: string[] = [];
  for (const [field, messages] of Object.entries(err.fields)) {
    if (known.includes(field)) setError(field as Path<F>, { type: 'server', message: messages.join('; ') });
    else unplaced.push(`${field}: ${messages.join('; ')}`);
  }
  return unplaced;
}

export const errorText = (err: unknown) => (err instanceof Error ? err.message : 'Something went wrong.');
