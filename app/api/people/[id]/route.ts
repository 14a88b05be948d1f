import { db } from '@/db';
import { idParams, json, route } from '@/lib/http/route';
import { one } from '@/lib/http/shapes';
import { updatePerson } from '@/lib/people/people';
import { updatePersonSchema } from '@/lib/people/schema';

export const PATCH = route({
  method: 'PATCH',
  summary: 'Changes a person’s roles in the current space, or disables or enables them',
  who: ['admin'],
  params: idParams,
  notFound: 'person',
  body: json(updatePersonSchema),
  response: one('person', 'The person with their roles.'),
  run: async ({ ctx, params, body }) => ({ person: await updatePerson(db, ctx, params.id, body) }),
});
