import { db } from '@/db';
import { idParams, route, STAFF } from '@/lib/http/route';
import { ok } from '@/lib/http/shapes';
import { deleteOffer } from '@/lib/restock/suppliers';

export const DELETE = route({
  method: 'DELETE',
  summary: 'Removes a supplier’s offer for a part',
  who: STAFF,
  params: idParams,
  notFound: 'offer',
  response: ok,
  run: ({ ctx, params }) => deleteOffer(db, ctx, params.id),
});
