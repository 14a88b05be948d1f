import { after } from 'next/server';
import { z } from 'zod';
import { db } from '@/db';
import { requestSignInLink } from '@/lib/auth/sign-in-link';
import { json, route } from '@/lib/http/route';
import { ok } from '@/lib/http/shapes';

const body = z.object({ email: z.string().trim().toLowerCase().email('a valid e-mail address').max(320) });

// Public by design: anyone may ask; the answer never says whether the address has an account.
export const POST = route({
  method: 'POST',
  summary: 'E-mails a one-time sign-in link (public; the same answer for any address)',
  who: 'anonymous',
  body: json(body),
  response: ok,
  run: async ({ body }) => {
    await requestSignInLink(db, body.email, after); // mailed after the answer: its timing tells nothing
    return { ok: true };
  },
});
