import { db } from '@/db';
import { json, route } from '@/lib/http/route';
import { one } from '@/lib/http/shapes';
import { countBox } from '@/lib/honour-box/box';
import { boxCountInput } from '@/lib/honour-box/schemas';

export const POST = route({
  method: 'POST',
  summary: 'A steward records counting the honour box: expected against counted, a difference explained',
  who: ['steward', 'admin'],
  body: json(boxCountInput),
  status: 201,
  response: one('count', 'The count as recorded.'),
  run: async ({ ctx, body }) => ({ count: await countBox(db, ctx, body) }),
});
