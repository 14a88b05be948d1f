import { db } from '@/db';
import { json, route } from '@/lib/http/route';
import { one } from '@/lib/http/shapes';
import { writeResolution } from '@/lib/reconcile/resolutions';
import { monthForBooks, reconcileForBooks } from '@/lib/reconcile/run';
import { resolutionInput } from '@/lib/sales/schemas';

export const POST = route({
  method: 'POST',
  summary:
    'Writes the treasurer’s note on a reconciliation row that does not match (replaces an earlier one)',
  who: ['treasurer'],
  body: json(resolutionInput),
  status: 201,
  response: one('resolution', '{ rowKey, note, writtenBy, writtenAt }'),
  run: async ({ ctx, body }) => {
    const report = await reconcileForBooks(ctx, await monthForBooks(ctx, body.month));
    return { resolution: await writeResolution(db, ctx, body, report.rows) };
  },
});
