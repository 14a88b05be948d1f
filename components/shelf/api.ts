// Client-side calls to the shelf's JSON API: one error shape for every form.
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

export async function api<T>(path: string, init: { method?: string; body?: unknown } = {}): Promise<T> {
  const res = await fetch(path, {
    method: init.method ?? (init.body === undefined ? 'GET' : 'POST'),
    headers: init.body === undefined ? undefined : { 'content-type': 'application/json' },
    body: init.body === undefined ? undefined : JSON.stringify(init.body),
  });
  const data = await res.json().catch(() => null);
  if (!res.ok) {
    const err = data?.error;
    throw new ApiError(res.status, err?.message ?? `The server answered ${res.status}.`, err?.fields ?? {});
  }
  return data as T;
}

/** Errors for one field, including nested ones (`specs` collects `specs.vfMin` …). */
export function fieldError(fields: FieldErrors | undefined, key: string): string | undefined {
  return fields?.[key]?.join('; ');
}
