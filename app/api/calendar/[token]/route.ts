import { z } from 'zod';
import { db } from '@/db';
import { env } from '@/lib/env';
import { route } from '@/lib/http/route';
import { calendarFeed } from '@/lib/loans/calendar';

// No session: the secret in the URL is the key (calendar apps cannot sign in). It only reads.
const params = z.object({ token: z.string().max(200).transform((t) => t.replace(/\.ics$/, '')) });

export const GET = route({
  method: 'GET',
  summary: 'A person’s due dates as an iCalendar feed (the secret address is the key)',
  who: 'anonymous',
  params,
  notFound: 'calendar',
  produces: { contentType: 'text/calendar', description: 'An iCalendar feed of the person’s loans.' },
  run: async ({ params }) =>
    new Response(await calendarFeed(db, params.token, env().APP_BASE_URL), {
      headers: {
        'content-type': 'text/calendar; charset=utf-8',
        'content-disposition': 'inline; filename="ohmstead-loans.ics"',
        'cache-control': 'private, max-age=300',
      },
    }),
});
