// The `/v1` routes the fake answers, each parsing its params with a strict schema (unknown params are
// refused with the param named, as the real API does).
import { z } from 'zod';
import { createSession, createSessionParams, expireSession, getSession } from './checkout';
import type { Ctx } from './context';
import { fromZod, missing } from './errors';
import { expandObject } from './expand';
import type { FormObject } from './form';
import { balanceObject } from './ledger';
import { listParams, paginate } from './list';
import { retrieveParams } from './params';
import { createRefund, createRefundParams } from './refunds';
import type { ApiObject, Collections } from './state';

/** `match` holds the decoded path segments the pattern captured. */
export type Handler = (ctx: Ctx, params: FormObject, match: string[], path: string) => unknown;
export type Route = { method: 'GET' | 'POST'; pattern: RegExp; handle: Handler };

export function parse<S extends z.ZodType>(schema: S, params: unknown): z.output<S> {
  const result = schema.safeParse(params);
  if (!result.success) throw fromZod(result.error);
  return result.data;
}

type Table = keyof Omit<Collections, 'lineItems'>;

function retrieve(table: Table, objectName: string): Handler {
  return (ctx, params, [, id]) => {
    const p = parse(retrieveParams, params);
    const found = ctx.state[table][id];
    if (!found) throw missing(objectName, id);
    return expandObject(ctx, found, p.expand);
  };
}

type ListOptions = {
  /** Extra string params compared for equality with the same-named field. */
  fields?: string[];
  extra?: z.ZodRawShape;
  match?: (o: ApiObject, p: Record<string, unknown>) => boolean;
};

function list(table: Table, { fields = [], extra = {}, match }: ListOptions = {}): Handler {
  const schema = listParams.extend({
    ...Object.fromEntries(fields.map((f) => [f, z.string().optional()])),
    ...extra,
  });
  return (ctx, params, _m, path) => {
    const p = parse(schema, params) as z.infer<typeof listParams> & Record<string, unknown>;
    const items = Object.values(ctx.state[table]).filter(
      (o) => fields.every((f) => p[f] === undefined || o[f] === p[f]) && (!match || match(o, p)),
    );
    return expandObject(ctx, paginate(items, p, path), p.expand);
  };
}

function eventTypeMatches(o: ApiObject, p: Record<string, unknown>): boolean {
  const wanted = p.types as string[] | undefined;
  if (wanted?.length) return wanted.includes(o.type as string);
  const type = p.type as string | undefined;
  if (!type) return true;
  // `charge.*` style wildcards, as the real events list allows.
  return type.endsWith('.*') ? (o.type as string).startsWith(type.slice(0, -1)) : o.type === type;
}

export const apiRoutes: Route[] = [
  {
    method: 'POST',
    pattern: /^\/v1\/checkout\/sessions$/,
    handle: (ctx, params) => {
      const p = parse(createSessionParams, params);
      return expandObject(ctx, createSession(ctx, p), p.expand);
    },
  },
  {
    method: 'GET',
    pattern: /^\/v1\/checkout\/sessions$/,
    handle: list('sessions', { fields: ['status', 'payment_intent', 'client_reference_id'] }),
  },
  {
    method: 'GET',
    pattern: /^\/v1\/checkout\/sessions\/([^/]+)$/,
    handle: retrieve('sessions', 'checkout.session'),
  },
  {
    method: 'POST',
    pattern: /^\/v1\/checkout\/sessions\/([^/]+)\/expire$/,
    handle: (ctx, params, [, id]) =>
      expandObject(ctx, expireSession(ctx, id), parse(retrieveParams, params).expand),
  },
  {
    method: 'GET',
    pattern: /^\/v1\/checkout\/sessions\/([^/]+)\/line_items$/,
    handle: (ctx, params, [, id], path) => {
      const session = getSession(ctx, id);
      return paginate(ctx.state.lineItems[session.id] ?? [], parse(listParams, params), path, false);
    },
  },
  { method: 'GET', pattern: /^\/v1\/payment_intents$/, handle: list('paymentIntents') },
  {
    method: 'GET',
    pattern: /^\/v1\/payment_intents\/([^/]+)$/,
    handle: retrieve('paymentIntents', 'payment_intent'),
  },
  { method: 'GET', pattern: /^\/v1\/charges$/, handle: list('charges', { fields: ['payment_intent'] }) },
  { method: 'GET', pattern: /^\/v1\/charges\/([^/]+)$/, handle: retrieve('charges', 'charge') },
  {
    method: 'POST',
    pattern: /^\/v1\/refunds$/,
    handle: (ctx, params) => {
      const p = parse(createRefundParams, params);
      return expandObject(ctx, createRefund(ctx, p), p.expand);
    },
  },
  {
    method: 'GET',
    pattern: /^\/v1\/refunds$/,
    handle: list('refunds', { fields: ['payment_intent', 'charge'] }),
  },
  { method: 'GET', pattern: /^\/v1\/refunds\/([^/]+)$/, handle: retrieve('refunds', 'refund') },
  {
    method: 'GET',
    pattern: /^\/v1\/balance_transactions$/,
    handle: list('balanceTransactions', { fields: ['type', 'source', 'currency'] }),
  },
  {
    method: 'GET',
    pattern: /^\/v1\/balance_transactions\/([^/]+)$/,
    handle: retrieve('balanceTransactions', 'balance_transaction'),
  },
  {
    method: 'GET',
    pattern: /^\/v1\/balance$/,
    handle: (ctx, params) => {
      parse(z.object({}).strict(), params);
      return balanceObject(ctx);
    },
  },
  { method: 'GET', pattern: /^\/v1\/payouts$/, handle: list('payouts', { fields: ['status', 'currency'] }) },
  { method: 'GET', pattern: /^\/v1\/payouts\/([^/]+)$/, handle: retrieve('payouts', 'payout') },
  {
    method: 'GET',
    pattern: /^\/v1\/events$/,
    handle: list('events', {
      extra: { type: z.string().optional(), types: z.array(z.string()).max(20).optional() },
      match: eventTypeMatches,
    }),
  },
  { method: 'GET', pattern: /^\/v1\/events\/([^/]+)$/, handle: retrieve('events', 'event') },
];
