import { db } from '@/db';
import { renderLabelsPdf } from '@/labels/pdf';
import { env } from '@/lib/env';
import { json, route, STAFF } from '@/lib/http/route';
import { chooseLayout, labelItemsFor } from '@/lib/inventory/labels';
import { labelRequestSchema } from '@/lib/inventory/schemas';

const PDF_HEADERS = {
  'Content-Type': 'application/pdf',
  'Content-Disposition': 'inline; filename="labels.pdf"',
  'Cache-Control': 'no-store',
};

/** With `Accept: application/x-ndjson` the answer streams `{"done":n,"total":m}` lines, then `{"pdf":"<base64>"}`. */
function progressStream(render: (onProgress: (done: number, total: number) => void) => Promise<Uint8Array>, total: number, layoutId: string) {
  const encoder = new TextEncoder();
  const line = (o: unknown) => encoder.encode(`${JSON.stringify(o)}\n`);
  return new ReadableStream<Uint8Array>({
    async start(controller) {
      controller.enqueue(line({ done: 0, total, layoutId }));
      try {
        const pdf = await render((done, t) => controller.enqueue(line({ done, total: t })));
        controller.enqueue(line({ pdf: Buffer.from(pdf).toString('base64') }));
      } catch (err) {
        const message = err instanceof Error ? err.message : 'could not render the labels';
        controller.enqueue(line({ error: { code: 'invalid', message } }));
      }
      controller.close();
    },
  });
}

export const POST = route({
  method: 'POST',
  summary: 'A selection of parts, bins, codes or today’s receipts → a label PDF (or an NDJSON progress stream)',
  who: STAFF,
  body: json(labelRequestSchema),
  produces: { contentType: 'application/pdf', description: 'The label sheet; NDJSON progress lines with Accept: application/x-ndjson.' },
  run: async ({ req, ctx, body }) => {
    const layoutId = await chooseLayout(db, ctx, body.layoutId);
    const items = await labelItemsFor(db, ctx, body.selection, env().APP_BASE_URL);
    const options = { skipSlots: body.skipSlots, outline: body.outline, title: `Labels (${items.length})` };
    if (!(req.headers.get('accept') ?? '').includes('application/x-ndjson')) {
      const pdf = await renderLabelsPdf(items, layoutId, options);
      return new Response(Buffer.from(pdf), { headers: { ...PDF_HEADERS, 'X-Label-Count': String(items.length) } });
    }
    const stream = progressStream((onProgress) => renderLabelsPdf(items, layoutId, { ...options, onProgress }), items.length, layoutId);
    return new Response(stream, {
      headers: { 'Content-Type': 'application/x-ndjson; charset=utf-8', 'Cache-Control': 'no-store' },
    });
  },
});
