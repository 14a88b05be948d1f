import type { FieldValues, Path, UseFormSetError } from 'react-hook-form';
import { ApiError, callApi } from '@/components/ui/api';

// The browser side of our JSON routes: one error shape ({ error: { code, message, fields } }) in,
// field messages onto the form they came from.

export { ApiError, errorText } from '@/components/ui/api';

/** JSON writes from the People and Settings forms. */
export const sendJson = <T>(url: string, method: 'POST' | 'PATCH' | 'DELETE', body?: unknown): Promise<T> =>
  callApi<T>(url, method, body);

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

