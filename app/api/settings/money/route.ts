import { db } from '@/db';
import { json, route } from '@/lib/http/route';
import { one } from '@/lib/http/shapes';
import { moneyRulesPatchSchema } from '@/lib/money-rules/schema';
import { moneyRules, updateMoneyRules } from '@/lib/money-rules/settings';

export const GET = route({
  method: 'GET',
  summary: 'The space’s money rules: tax (mode, rate, name), smallest card payment, account code per category',
  who: ['admin'],
  response: one('rules', 'The space’s money rules.'),
  run: async ({ ctx }) => ({ rules: await moneyRules(db, ctx.spaceId) }),
});

export const PATCH = route({
  method: 'PATCH',
  summary: 'Changes any of the money rules; past sales keep the tax they were sold under',
  who: ['admin'],
  body: json(moneyRulesPatchSchema),
  response: one('rules', 'The space’s money rules.'),
  run: async ({ ctx, body }) => ({ rules: await updateMoneyRules(db, ctx, body) }),
});
