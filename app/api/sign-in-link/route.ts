import { after, NextResponse } from 'next/server';
import { z } from 'zod';
import { db } from '@/db';
import { handle, parseJsonBody } from '@/lib/http/respond';
import { mailSignInLinkIfKnown } from '@/lib/auth/signin';
import { linkLimiter, take } from '@/lib/auth/rate-limit';
import { TooManyError } from '@/lib/errors';

const body = z.object({ email: z.string().trim().toLowerCase().email('a valid e-mail address').max(320) });

/** Public by design: anyone may ask; the answer never says whether the address has an account. */
export const POST = handle(async (req: Request) => {
  const { email } = await parseJsonBody(req, body);
  if (!(await take(linkLimiter(), email))) throw new TooManyError();
  after(() => mailSignInLinkIfKnown(db, email)); // after the answer: its timing tells nothing
  return NextResponse.json({ ok: true });
});
