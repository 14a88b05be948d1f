// The one way client components call our JSON API: errors come back as { error: { message, fields } }.
export type ApiError = { status: number; message: string; fields?: Record<string, string[]> };

export async function callApi<T>(url: string, method: string, body?: unknown): Promise<T> {
  const res = await fetch(url, {
    method,
    headers: body === undefined ? undefined : { 'content-type': 'application/json' },
    body: body === undefined ? undefined : JSON.stringify(body),
  });
  const data = await res.json().catch(() => ({}));
  if (!res.ok) {
    const e = (data as { error?: { message?: string; fields?: Record<string, string[]> } }).error;
    throw {
      status: res.status,
      message: e?.message ?? `The server answered ${res.status}.`,
      fields: e?.fields,
    } satisfies ApiError;
  }
  return data as T;
}

export const errorText = (err: unknown) => (err as ApiError)?.message ?? 'Something went wrong.';
