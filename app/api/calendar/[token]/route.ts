import { db } from '@/db';
import { env } from '@/lib/env';
import { handle } from '@/lib/http/respond';
import { calendarFeed } from '@/lib/loans/calendar';

// /api/calendar/<token>.ics — a person's due dates for their calendar app. No session: the secret in
// the URL is the key (calendar apps cannot sign in). It only reads.
export const GET = handle(async (_req: Request, { params }: { params: Promise<{ token: string }> }) => {
  const token = (await params).token.replace(/\.ics$/, '');
  const body = await calendarFeed(db, token, env().APP_BASE_URL);
  return new Response(body, {
    headers: {
      'content-type': 'text/calendar; charset=utf-8',
      'content-disposition': 'inline; filename="ohmstead-loans.ics"',
      'cache-control': 'private, max-age=300',
    },
  });
});
