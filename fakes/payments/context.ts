// What every resource handler works on: the state, the fake's clock and the hook that turns a change
// into an event (and the event into webhook deliveries).
import { newId, type ApiObject, type State } from './state';

export type RequestInfo = { id: string; idempotency_key: string | null };

export type Ctx = {
  state: State;
  /** Unix seconds on the fake's clock (real time plus the offset set through /_fake/clock). */
  now(): number;
  publicUrl: string;
  /** Set while an API request runs, so its events name the request like the real ones do. */
  request: RequestInfo | null;
  apiVersion: string | null;
  onEvent(event: ApiObject): void;
};

/** A deep copy, so an event keeps the object as it was when the event happened. */
export const snapshot = <T>(value: T): T => structuredClone(value);

export function createEvent(ctx: Ctx, type: string, object: ApiObject): ApiObject {
  const event: ApiObject = {
    id: newId('evt'),
    object: 'event',
    api_version: ctx.apiVersion,
    created: ctx.now(),
    data: { object: snapshot(object) },
    livemode: false,
    pending_webhooks: 0,
    request: ctx.request ? { ...ctx.request } : { id: null, idempotency_key: null },
    type,
  };
  ctx.state.events[event.id] = event;
  ctx.onEvent(event);
  return event;
}

/** Finds any stored object by its id prefix (used by `expand`). */
export function lookup(state: State, id: string): ApiObject | undefined {
  const prefix = id.slice(0, id.indexOf('_'));
  const table: Record<string, Record<string, ApiObject>> = {
    cs: state.sessions,
    pi: state.paymentIntents,
    ch: state.charges,
    re: state.refunds,
    txn: state.balanceTransactions,
    po: state.payouts,
    evt: state.events,
  };
  return table[prefix]?.[id];
}
