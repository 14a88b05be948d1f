'use client';
import { useCallback, useMemo, useSyncExternalStore } from 'react';

// The counter's basket lives in this tab's sessionStorage, so leaving the page (the card processor's page,
// then Back) does not empty it. It is kept until the sale it became is paid or ends unpaid (the payment
// page, components/counter/sale-status.tsx), a cash sale is recorded, or the person empties it.

type Stored = { lines: [string, number][]; pendingSale?: string };

const keyOf = (owner: string) => `ohmstead:counter-basket:${owner}`;
const listeners = new Set<() => void>();
const EMPTY = '{"lines":[]}';

function read(key: string): string {
  try {
    return sessionStorage.getItem(key) ?? EMPTY;
  } catch {
    return EMPTY; // storage switched off: the basket lives as long as the page
  }
}

function parse(raw: string): Stored {
  try {
    const v = JSON.parse(raw) as Stored;
    return Array.isArray(v.lines) ? v : { lines: [] };
  } catch {
    return { lines: [] };
  }
}

function write(key: string, value: Stored | null) {
  try {
    if (value && (value.lines.length || value.pendingSale))
      sessionStorage.setItem(key, JSON.stringify(value));
    else sessionStorage.removeItem(key);
  } catch {
    // storage full or switched off: nothing to keep
  }
  for (const l of listeners) l();
}

function subscribe(listener: () => void) {
  listeners.add(listener);
  window.addEventListener('storage', listener);
  return () => {
    listeners.delete(listener);
    window.removeEventListener('storage', listener);
  };
}

/** The basket (part id → quantity) of this person in this tab, and a way to change it. */
export function useStoredBasket(owner: string) {
  const key = keyOf(owner);
  // On the server and in the first render the basket is empty; the stored one follows straight after.
  const raw = useSyncExternalStore(
    subscribe,
    () => read(key),
    () => EMPTY,
  );
  const basket = useMemo(() => new Map(parse(raw).lines), [raw]);
  const update = useCallback(
    (change: (b: Map<string, number>) => Map<string, number>) => {
      const now = parse(read(key));
      write(key, { ...now, lines: [...change(new Map(now.lines))] });
    },
    [key],
  );
  /** Notes the card sale the basket became, so that sale's end (and only it) empties the basket. */
  const markPending = useCallback(
    (saleId: string) => write(key, { ...parse(read(key)), pendingSale: saleId }),
    [key],
  );
  const clear = useCallback(() => write(key, null), [key]);
  return { basket, update, markPending, clear };
}

/** Empties the basket if it became this sale (called once the sale is paid or has ended unpaid). */
export function settleStoredBasket(owner: string, saleId: string) {
  const key = keyOf(owner);
  if (parse(read(key)).pendingSale === saleId) write(key, null);
}
