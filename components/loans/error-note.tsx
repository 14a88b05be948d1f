import { errorText } from './api';

/** The server's own words when a call failed, announced to screen readers. */
export function ErrorNote({ error, small = false }: { error: unknown; small?: boolean }) {
  if (!error) return null;
  return (
    <p
      role="alert"
      className={small ? 'text-sm text-red-800 dark:text-red-300' : 'text-red-800 dark:text-red-300'}
    >
      {errorText(error)}
    </p>
  );
}
