// `expand[]`: replaces an id field with the object it names (`payment_intent`, `data.source`,
// `latest_charge.balance_transaction`, ...). A checkout session's `line_items` expand to a list.
import { lookup, type Ctx } from './context';
import { invalid } from './errors';
import type { ApiObject } from './state';

type Json = Record<string, unknown>;

function expandPath(ctx: Ctx, node: Json, segments: string[], full: string): void {
  const [field, ...rest] = segments;
  if (field === 'line_items' && node.object === 'checkout.session') {
    const data = ctx.state.lineItems[node.id as string] ?? [];
    node.line_items = {
      object: 'list',
      data,
      has_more: false,
      url: `/v1/checkout/sessions/${String(node.id)}/line_items`,
    };
  } else if (typeof node[field] === 'string') {
    const found = lookup(ctx.state, node[field] as string);
    if (found) node[field] = structuredClone(found);
  } else if (!(field in node)) {
    throw invalid(`This property cannot be expanded (${full}).`, 'expand');
  }
  const child = node[field];
  if (rest.length === 0 || child === null || typeof child !== 'object') return;
  if (Array.isArray(child)) child.forEach((c) => expandPath(ctx, c as Json, rest, full));
  else expandPath(ctx, child as Json, rest, full);
}

/** Returns a copy with the requested paths expanded (the stored object is never changed). */
export function expandObject<T extends ApiObject | Json>(ctx: Ctx, value: T, paths: string[] | undefined): T {
  if (!paths?.length) return value;
  const copy = structuredClone(value) as Json;
  for (const p of paths) expandPath(ctx, copy, p.split('.'), p);
  return copy as T;
}
