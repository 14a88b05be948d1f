import { db } from '@/db';
import { json, route } from '@/lib/http/route';
import { one } from '@/lib/http/shapes';
import { budgetFigures, setMonthlyBudget } from '@/lib/restock/budget';
import { budgetSchema } from '@/lib/restock/schemas';

export const GET = route({
  method: 'GET',
  summary: 'The monthly restocking budget, and this month’s committed and received against it',
  who: ['admin'],
  response: one('budget', 'The budget and the month’s figures.'),
  run: async ({ ctx }) => ({ budget: await budgetFigures(db, ctx) }),
});

export const PATCH = route({
  method: 'PATCH',
  summary: 'Sets the monthly restocking budget (minor units of the space’s currency; null for none)',
  who: ['admin'],
  body: json(budgetSchema),
  response: one('budget', 'The budget and the month’s figures.'),
  run: ({ ctx, body }) => setMonthlyBudget(db, ctx, body.monthlyBudgetMinor),
});
