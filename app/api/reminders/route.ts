import { db } from '@/db';
import { json, route, STAFF } from '@/lib/http/route';
import { record } from '@/lib/http/shapes';
import { reminderSchema } from '@/lib/loans/schemas';
import { sendManualReminders } from '@/lib/reminders/manual';

export const POST = route({
  method: 'POST',
  summary: '“Send a reminder now” for one loan or many (the steward’s round)',
  who: STAFF,
  body: json(reminderSchema),
  response: record('{ reminders: what was sent, per loan }'),
  run: async ({ ctx, body }) => ({ reminders: await sendManualReminders(db, ctx, body.loanIds) }),
});
