// List objects with cursor pagination: newest first, `limit` 1–100 (default 10), `starting_after`
// walks to older objects, `ending_before` to newer ones, `created` filters by timestamp.
import { z } from 'zod';
import { invalid } from './errors';
import { expand, intString } from './params';
import type { ApiObject } from './state';

const createdFilter = z.union([
  intString,
  z.object({ gt: intString, gte: intString, lt: intString, lte: intString }).partial().strict(),
]);

export const listParams = z
  .object({
    limit: intString.refine((n) => n >= 1 && n <= 100, 'Must be between 1 and 100').optional(),
    starting_after: z.string().optional(),
    ending_before: z.string().optional(),
    created: createdFilter.optional(),
    expand,
  })
  .strict();

export type ListParams = z.infer<typeof listParams>;
export type ListObject = { object: 'list'; data: ApiObject[]; has_more: boolean; url: string };

function matchesCreated(created: number, filter: ListParams['created']): boolean {
  if (filter === undefined) return true;
  if (typeof filter === 'number') return created === filter;
  return (
    (filter.gt === undefined || created > filter.gt) &&
    (filter.gte === undefined || created >= filter.gte) &&
    (filter.lt === undefined || created < filter.lt) &&
    (filter.lte === undefined || created <= filter.lte)
  );
}

/**
 * `items` is the collection in creation order; the answer is newest first like the real API, except
 * for sub-lists such as a session's line items, which keep their given order (`newestFirst: false`).
 */
export function paginate(
  items: ApiObject[],
  params: ListParams,
  url: string,
  newestFirst = true,
): ListObject {
  if (params.starting_after && params.ending_before) {
    throw invalid(
      'You may only specify one of these parameters: ending_before, starting_after.',
      'ending_before',
    );
  }
  const limit = params.limit ?? 10;
  const filtered = items.filter((o) => matchesCreated(o.created, params.created));
  const all = newestFirst ? filtered.reverse() : filtered;
  const cursor = params.starting_after ?? params.ending_before;
  const at = cursor === undefined ? -1 : all.findIndex((o) => o.id === cursor);
  if (cursor !== undefined && at < 0) {
    const param = params.starting_after ? 'starting_after' : 'ending_before';
    throw invalid(`No such object to paginate from: '${cursor}'`, param, 'resource_missing');
  }
  if (params.ending_before) {
    // The page just newer than the cursor, still newest first; has_more says whether newer ones remain.
    const start = Math.max(0, at - limit);
    return { object: 'list', data: all.slice(start, at), has_more: start > 0, url };
  }
  const start = at + 1;
  return { object: 'list', data: all.slice(start, start + limit), has_more: start + limit < all.length, url };
}
