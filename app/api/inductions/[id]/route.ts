import { db } from '@/db';
import { idParams, json, route } from '@/lib/http/route';
import { one } from '@/lib/http/shapes';
import { updateInduction } from '@/lib/inductions/manage';
import { inductionPatchSchema } from '@/lib/inductions/schemas';

export const PATCH = route({
  method: 'PATCH',
  summary: 'Renames or describes an induction, changes what needs it, archives or restores it',
  who: ['steward', 'admin'],
  params: idParams,
  notFound: 'induction',
  body: json(inductionPatchSchema),
  response: one('induction', 'The induction.'),
  run: async ({ ctx, params, body }) => ({ induction: await updateInduction(db, ctx, params.id, body) }),
});
