import { idParams, route } from '@/lib/http/route';
import { one } from '@/lib/http/shapes';
import { checkSaleNow } from '@/lib/sales/check';

// "Check again" on the status page: ask the processor about a pending card sale now.
export const POST = route({
  method: 'POST',
  summary: 'Asks the processor about a pending card sale now (“check again” on the status page)',
  who: 'signed-in',
  params: idParams,
  notFound: 'sale',
  response: one('sale', 'The sale after the check.'),
  run: async ({ ctx, params }) => ({ sale: await checkSaleNow(ctx, params.id) }),
});
