// Client-side calls to the shelf's JSON API, through the shared client.
import { callApi } from '@/components/ui/api';

export { ApiError, fieldError, type FieldErrors } from '@/components/ui/api';

export function api<T>(path: string, init: { method?: string; body?: unknown } = {}): Promise<T> {
  return callApi<T>(path, init.method ?? (init.body === undefined ? 'GET' : 'POST'), init.body);
}
