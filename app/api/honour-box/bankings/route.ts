import { db } from '@/db';
import { json, route } from '@/lib/http/route';
import { one } from '@/lib/http/shapes';
import { bankBox } from '@/lib/honour-box/box';
import { boxBankingInput } from '@/lib/honour-box/schemas';

export const POST = route({
  method: 'POST',
  summary: 'A steward records taking the latest count of the honour box to the bank',
  who: ['steward', 'admin'],
  body: json(boxBankingInput),
  status: 201,
  response: one('count', 'The count with its banking.'),
  run: async ({ ctx, body }) => ({ count: await bankBox(db, ctx, body) }),
});
