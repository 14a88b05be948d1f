import { NextResponse } from 'next/server';
import { db } from '@/db';
import { requireUser } from '@/lib/auth/guard';
import { env } from '@/lib/env';
import { handle } from '@/lib/http/respond';
import { calendarToken, rotateCalendarToken } from '@/lib/loans/calendar';

// My calendar-feed address (GET: null until I make one; reading writes nothing), or a new one that
// revokes the old (POST).
const url = (token: string) => `${env().APP_BASE_URL}/api/calendar/${token}.ics`;

export const GET = handle(async () => {
  const ctx = await requireUser();
  const token = await calendarToken(db, ctx.userId);
  return NextResponse.json({ url: token ? url(token) : null });
});

export const POST = handle(async () => {
  const ctx = await requireUser();
  return NextResponse.json({ url: url(await rotateCalendarToken(db, ctx.userId)) });
});
