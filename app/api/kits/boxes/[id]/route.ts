import { db } from '@/db';
import { idParams, route } from '@/lib/http/route';
import { record } from '@/lib/http/shapes';
import { getBox } from '@/lib/kits/box-detail';
import { previewLoan } from '@/lib/loans/preview';

export const GET = route({
  method: 'GET',
  summary: 'A kit box with its contents and the check on its exact units',
  who: 'signed-in',
  params: idParams,
  notFound: 'kit box',
  response: record('{ box, check: { verdict, outcome, available, unavailable, dueAt } }'),
  run: async ({ ctx, params }) => {
    const box = await getBox(db, ctx, params.id);
    const preview = await previewLoan(db, ctx, { kitBoxId: params.id });
    return {
      box,
      check: {
        verdict: preview.outcome.verdict,
        outcome: preview.outcome,
        available: preview.available,
        unavailable: preview.unavailable,
        dueAt: preview.dueAt,
      },
    };
  },
});
