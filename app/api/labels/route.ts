import { db } from '@/db';
import { renderLabelsPdf } from '@/labels/pdf';
import { env } from '@/lib/env';
import { handle, parseJsonBody } from '@/lib/http/respond';
import { shelfWriter } from '@/lib/inventory/access';
import { chooseLayout, labelItemsFor } from '@/lib/inventory/labels';
import { labelRequestSchema } from '@/lib/inventory/schemas';

const PDF_HEADERS = {
  'Content-Type': 'application/pdf',
  'Content-Disposition': 'inline; filename="labels.pdf"',
  'Cache-Control': 'no-store',
};

/**
 * A selection → a label PDF: { selection: { kind: 'part', partId } | { kind: 'location', locationId }
 * | { kind: 'codes', codes } | { kind: 'today' }, layoutId?, skipSlots?, outline? }.
 * With `Accept: application/x-ndjson` the answer streams progress lines `{"done":n,"total":m}` and
 * ends with `{"pdf":"<base64>"}`, so a large run can show a progress bar.
 */
export const POST = handle(async (req: Request) => {
  const ctx = await shelfWriter();
  const input = await parseJsonBody(req, labelRequestSchema);
  const layoutId = await chooseLayout(db, ctx, input.layoutId);
  const items = await labelItemsFor(db, ctx, input.selection, env().APP_BASE_URL);
  const options = { skipSlots: input.skipSlots, outline: input.outline, title: `Labels (${items.length})` };

  if (!(req.headers.get('accept') ?? '').includes('application/x-ndjson')) {
    const pdf = await renderLabelsPdf(items, layoutId, options);
    return new Response(Buffer.from(pdf), {
      headers: { ...PDF_HEADERS, 'X-Label-Count': String(items.length) },
    });
  }

  const encoder = new TextEncoder();
  const line = (o: unknown) => encoder.encode(`${JSON.stringify(o)}\n`);
  const stream = new ReadableStream<Uint8Array>({
    async start(controller) {
      controller.enqueue(line({ done: 0, total: items.length, layoutId }));
      try {
        const pdf = await renderLabelsPdf(items, layoutId, {
          ...options,
          onProgress: (done, total) => controller.enqueue(line({ done, total })),
        });
        controller.enqueue(line({ pdf: Buffer.from(pdf).toString('base64') }));
      } catch (err) {
        controller.enqueue(
          line({
            error: {
              code: 'invalid',
              message: err instanceof Error ? err.message : 'could not render the labels',
            },
          }),
        );
      }
      controller.close();
    },
  });
  return new Response(stream, {
    headers: { 'Content-Type': 'application/x-ndjson; charset=utf-8', 'Cache-Control': 'no-store' },
  });
});
