import { db } from '@/db';
import { json, route } from '@/lib/http/route';
import { one } from '@/lib/http/shapes';
import { borrowingRulesPatchSchema } from '@/lib/rules/schema';
import { borrowingRules, updateBorrowingRules } from '@/lib/rules/settings';

export const GET = route({
  method: 'GET',
  summary: 'Who may borrow and when things fall due: standing, opening calendar, hand-over, reminder pause',
  who: ['admin'],
  response: one('rules', 'The space’s borrowing rules.'),
  run: async ({ ctx }) => ({ rules: await borrowingRules(db, ctx.spaceId) }),
});

export const PATCH = route({
  method: 'PATCH',
  summary: 'Changes any of the borrowing rules; each field is validated and named on error',
  who: ['admin'],
  body: json(borrowingRulesPatchSchema),
  response: one('rules', 'The space’s borrowing rules.'),
  run: async ({ ctx, body }) => ({ rules: await updateBorrowingRules(db, ctx, body) }),
});
