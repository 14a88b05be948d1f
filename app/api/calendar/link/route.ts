import { z } from 'zod';
import { db } from '@/db';
import { env } from '@/lib/env';
import { route } from '@/lib/http/route';
import { calendarToken, rotateCalendarToken } from '@/lib/loans/calendar';

const url = (token: string) => `${env().APP_BASE_URL}/api/calendar/${token}.ics`;
const response = z.object({ url: z.string() });

export const GET = route({
  method: 'GET',
  summary: 'My calendar-feed address',
  who: 'signed-in',
  response,
  run: async ({ ctx }) => ({ url: url(await calendarToken(db, ctx.userId)) }),
});

export const POST = route({
  method: 'POST',
  summary: 'A new calendar-feed address; the old one stops working',
  who: 'signed-in',
  response,
  run: async ({ ctx }) => ({ url: url(await rotateCalendarToken(db, ctx.userId)) }),
});
