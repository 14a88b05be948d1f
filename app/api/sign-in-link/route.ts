import { NextResponse } from 'next/server';
import { z } from 'zod';
import { db } from '@/db';
import { handle, parseJsonBody } from '@/lib/http/respond';
import { createSignInToken } from '@/lib/auth/signin';
import { linkLimiter, take } from '@/lib/auth/rate-limit';
import { TooManyError } from '@/lib/errors';
import { sendSignInLink } from '@/lib/mail/templates';

const body = z.object({ email: z.string().trim().toLowerCase().email('a valid e-mail address').max(320) });

/** Public by design: anyone may ask; the answer never says whether the address has an account. */
export const POST = handle(async (req: Request) => {
  const { email } = await parseJsonBody(req, body);
  if (!(await take(linkLimiter(), email))) throw new TooManyError();
  const created = await db.transaction().execute((trx) => createSignInToken(trx, email));
  if (created) await sendSignInLink(created.user, created.token);
  return NextResponse.json({ ok: true });
});
