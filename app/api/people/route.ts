import { db } from '@/db';
import { route } from '@/lib/http/route';
import { listOf } from '@/lib/http/shapes';
import { listPeople } from '@/lib/people/people';

export const GET = route({
  method: 'GET',
  summary: 'The people of the admin’s current space',
  who: ['admin'],
  response: listOf('people', 'A person with their roles.'),
  run: async ({ ctx }) => ({ people: await listPeople(db, ctx) }),
});
