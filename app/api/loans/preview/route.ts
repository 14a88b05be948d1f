import { db } from '@/db';
import { json, route } from '@/lib/http/route';
import { one } from '@/lib/http/shapes';
import { previewLoan } from '@/lib/loans/preview';
import { previewSchema } from '@/lib/loans/schemas';

export const POST = route({
  method: 'POST',
  summary: 'The check on the exact parts before borrowing: report, cautions, what to change',
  who: 'signed-in',
  body: json(previewSchema),
  response: one('preview', 'The check’s outcome, availability and due date.'),
  run: async ({ ctx, body }) => ({
    preview: await previewLoan(db, ctx, body.selection, { borrowerId: body.borrowerId, ownParts: body.ownParts }),
  }),
});
