// The one way client components call our JSON API. Every error answer has the shape
// { error: { code, message, fields? } }; it arrives here as an ApiError with the fields kept.
export type FieldErrors = Record<string, string[]>;

export class ApiError extends Error {
  constructor(
    readonly status: number,
    message: string,
    readonly fields: FieldErrors = {},
  ) {
    super(message);
  }
}

export async function callApi<T>(url: string, method: string, body?: unknown): Promise<T> {
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
    const e = (data as { error?: { message?: string; fields?: FieldErrors } } | null)?.error;
    throw new ApiError(res.status, e?.message ?? `The server answered ${res.status}.`, e?.fields ?? {});
  }
  return data as T;
}

export const errorText = (err: unknown) => (err instanceof Error ? err.message : 'Something went wrong.');

/** Errors for one field, joined for display. */
export function fieldError(fields: FieldErrors | undefined, key: string): string | undefined {
  return fields?.[key]?.join('; ');
}
