'use client';
import { useRef } from 'react';
import { switchSpace } from '@/app/actions/space';

/** The header's space picker: a plain form, so it works before JavaScript loads too. */
export function SpaceSwitcher({
  spaces,
  current,
}: {
  spaces: { id: string; name: string }[];
  current: string;
}) {
  const form = useRef<HTMLFormElement>(null);
  if (spaces.length < 2)
    return <span className="min-w-0 truncate text-sm font-semibold">{spaces[0]?.name}</span>;
  return (
    <form ref={form} action={switchSpace} className="flex min-w-0 items-center gap-1">
      <label htmlFor="space-switch" className="sr-only">
        Space
      </label>
      <select
        id="space-switch"
        name="spaceId"
        defaultValue={current}
        onChange={() => form.current?.requestSubmit()}
        className="w-full max-w-48 min-w-0 truncate rounded-md border border-stone-300 bg-white px-2 py-1 text-sm dark:border-stone-600 dark:bg-stone-900"
      >
        {spaces.map((s) => (
          <option key={s.id} value={s.id}>
            {s.name}
          </option>
        ))}
      </select>
      <noscript>
        <button className="btn-quiet" type="submit">
          Switch
        </button>
      </noscript>
    </form>
  );
}
