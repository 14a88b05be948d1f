import NextAuth from 'next-auth';
import { z } from 'zod';
import { authOptions } from '@/lib/auth/options';
import { route, urlencodedForm } from '@/lib/http/route';

// next-auth's own endpoints (csrf, session, providers, sign-in callbacks, sign-out), forwarded untouched
// once the declaration has checked the origin (a sign-out carries a session) and the form's type.
const nextAuth = NextAuth(authOptions) as (req: Request, context: unknown) => Promise<Response>;
const params = z.object({ nextauth: z.array(z.string().max(100)).min(1).max(3) });

export const GET = route({
  method: 'GET',
  summary: 'next-auth: CSRF token, session, providers',
  who: 'anonymous',
  params,
  produces: { contentType: 'application/json', description: 'next-auth’s own answer.' },
  run: ({ req, context }) => nextAuth(req, context),
});

export const POST = route({
  method: 'POST',
  summary: 'next-auth: sign in with a password or a link, sign out (form posts with a CSRF token)',
  who: 'anonymous',
  params,
  body: urlencodedForm(),
  produces: { contentType: 'application/json', description: 'next-auth’s own answer or redirect.' },
  run: ({ req, context }) => nextAuth(req, context),
});
