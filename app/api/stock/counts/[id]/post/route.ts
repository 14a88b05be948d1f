import { db } from '@/db';
import { idParams, route, STAFF } from '@/lib/http/route';
import { record } from '@/lib/http/shapes';
import { postCount } from '@/lib/inventory/counts';

export const POST = route({
  method: 'POST',
  summary: 'Posts a count: counted figures become the bin’s stock, each difference a movement',
  who: STAFF,
  params: idParams,
  notFound: 'count',
  response: record('The posted count with its differences.'),
  run: ({ ctx, params }) => postCount(db, ctx, params.id),
});
