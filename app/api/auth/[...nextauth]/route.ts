import type { NextRequest } from 'next/server';
import { z } from 'zod';
import { authRoute } from '@/lib/auth/nextauth-route';
import { route, urlencodedForm } from '@/lib/http/route';

// next-auth's own endpoints (csrf, session, providers, sign-in callbacks, sign-out), once the declaration
// has checked the origin (a sign-out carries a session) and the form's type; lib/auth/nextauth-route.ts
// fences them further (only next-auth's real actions, callback URLs kept on this site, junk a 4xx).
const params = z.object({ nextauth: z.array(z.string().max(100)).min(1).max(3) });
type AuthContext = Parameters<typeof authRoute>[1];

export const GET = route({
  method: 'GET',
  summary: 'next-auth: CSRF token, session, providers',
  who: 'anonymous',
  params,
  produces: { contentType: 'application/json', description: 'next-auth’s own answer.' },
  run: ({ req, context }) => authRoute(req as NextRequest, context as AuthContext),
});

export const POST = route({
  method: 'POST',
  summary: 'next-auth: sign in with a password or a link, sign out (form posts with a CSRF token)',
  who: 'anonymous',
  params,
  body: urlencodedForm(),
  produces: { contentType: 'application/json', description: 'next-auth’s own answer or redirect.' },
  run: ({ req, context }) => authRoute(req as NextRequest, context as AuthContext),
});
