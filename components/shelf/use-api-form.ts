'use client';
import { useState } from 'react';
import { ApiError, fieldError, type FieldErrors } from './api';

type FormState = { fields: FieldErrors; message: string; ok: boolean };

/**
 * The life of a form that posts to the JSON API: busy while it runs, the server's field errors on
 * their inputs after a refusal, a short confirmation after success.
 */
export function useApiForm() {
  const [state, setState] = useState<FormState>({ fields: {}, message: '', ok: false });
  const [busy, setBusy] = useState(false);

  async function run<T>(call: () => Promise<T>, done: (result: T) => string): Promise<T | undefined> {
    setBusy(true);
    setState((s) => ({ ...s, fields: {} }));
    try {
      const result = await call();
      setState({ fields: {}, message: done(result), ok: true });
      return result;
    } catch (e) {
      setState(
        e instanceof ApiError
          ? { fields: e.fields, message: e.message, ok: false }
          : { fields: {}, message: 'Could not reach the server.', ok: false },
      );
      return undefined;
    } finally {
      setBusy(false);
    }
  }

  return {
    ...state,
    busy,
    run,
    err: (key: string) => fieldError(state.fields, key),
    fail: (message: string, fields: FieldErrors = {}) => setState({ fields, message, ok: false }),
  };
}
