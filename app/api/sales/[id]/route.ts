import { db } from '@/db';
import { idParams, route } from '@/lib/http/route';
import { one } from '@/lib/http/shapes';
import { saleView } from '@/lib/sales/read';

export const dynamic = 'force-dynamic';

// One sale (the counter's status page polls this). Reading changes nothing: asking the processor about a
// sale past its expiry is POST …/settle, the Books sweep, or the processor's own expiry event.
export const GET = route({
  method: 'GET',
  summary: 'One sale (the counter’s status page polls this; reading changes nothing)',
  who: 'signed-in',
  params: idParams,
  notFound: 'sale',
  response: one('sale', 'The sale with its lines and status.'),
  run: async ({ ctx, params }) => ({ sale: await saleView(db, ctx, params.id) }),
});
