import { db } from '@/db';
import { idParams, route, STAFF } from '@/lib/http/route';
import { orderPdf } from '@/lib/restock/order-pdf';
import { orderDetail } from '@/lib/restock/orders';
import { spaceClock } from '@/lib/sales/periods';

export const GET = route({
  method: 'GET',
  summary: 'The order list as a printable PDF (A4)',
  who: STAFF,
  params: idParams,
  notFound: 'order',
  produces: { contentType: 'application/pdf', description: 'The order list, one A4 page or more.' },
  run: async ({ ctx, params }) => {
    const order = await orderDetail(db, ctx, params.id);
    const { timeZone } = await spaceClock(db, ctx.spaceId);
    const pdf = await orderPdf(order, ctx.spaceName, timeZone);
    return new Response(Buffer.from(pdf), {
      headers: {
        'Content-Type': 'application/pdf',
        'Content-Disposition': `inline; filename="order-${order.id.slice(0, 8)}.pdf"`,
        'Cache-Control': 'no-store',
      },
    });
  },
});
