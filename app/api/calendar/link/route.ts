import { z } from 'zod';
import { db } from '@/db';
import { env } from '@/lib/env';
import { route } from '@/lib/http/route';
import { calendarToken, rotateCalendarToken } from '@/lib/loans/calendar';

// My calendar-feed address (GET: null until I make one; reading writes nothing), or a new one that
// revokes the old (POST).
const url = (token: string) => `${env().APP_BASE_URL}/api/calendar/${token}.ics`;
const response = z.object({ url: z.string() });

export const GET = route({
  method: 'GET',
  summary: 'My calendar-feed address (null until one is made; reading writes nothing)',
  who: 'signed-in',
  response: z.object({ url: z.string().nullable() }),
  run: async ({ ctx }) => {
    const token = await calendarToken(db, ctx.userId);
    return { url: token ? url(token) : null };
  },
});

export const POST = route({
  method: 'POST',
  summary: 'A new calendar-feed address; the old one stops working',
  who: 'signed-in',
  response,
  run: async ({ ctx }) => ({ url: url(await rotateCalendarToken(db, ctx.userId)) }),
});
