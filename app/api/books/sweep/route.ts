import { route } from '@/lib/http/route';
import { one } from '@/lib/http/shapes';
import { sweepForBooks } from '@/lib/reconcile/run';

export const POST = route({
  method: 'POST',
  summary: 'Settles every overdue pending card sale of the space with the processor now',
  who: ['treasurer'],
  response: one('sweep', 'How many sales were settled, expired or left pending; receipts sent.'),
  run: async ({ ctx }) => {
    const result = await sweepForBooks(ctx);
    return { sweep: { ...result, receipts: result.receipts.length } };
  },
});
