import { db } from '@/db';
import { route } from '@/lib/http/route';
import { one } from '@/lib/http/shapes';
import { honourBox } from '@/lib/honour-box/box';

export const GET = route({
  method: 'GET',
  summary: 'The honour box: what it should hold now, and its counts and bankings, newest first',
  who: ['steward', 'admin', 'treasurer'],
  response: one('box', 'What the box should hold and its counts.'),
  run: async ({ ctx }) => ({ box: await honourBox(db, ctx) }),
});
