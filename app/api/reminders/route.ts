import { NextResponse } from 'next/server';
import { db } from '@/db';
import { requireRole } from '@/lib/auth/guard';
import { handle, parseJsonBody } from '@/lib/http/respond';
import { sendManualReminders } from '@/lib/reminders/manual';
import { reminderSchema } from '@/lib/loans/schemas';

// "Send a reminder now" for one loan or many (the steward's round).
export const POST = handle(async (req: Request) => {
  const ctx = await requireRole('steward', 'admin');
  const { loanIds } = await parseJsonBody(req, reminderSchema);
  const result = await sendManualReminders(db, ctx, loanIds);
  return NextResponse.json({ reminders: result });
});
