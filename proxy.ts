import { NextResponse, type NextRequest } from 'next/server';
import { getToken } from 'next-auth/jwt';
import { env } from '@/lib/env';
import { contentSecurityPolicy, newNonce } from '@/lib/http/csp';

// Runs before every page (not the API, which has its own gate in lib/http/route.ts). Two jobs:
// a per-request Content-Security-Policy nonce (Next reads it from the request's CSP header and puts it
// on its scripts; `x-nonce` carries it for a page that needs it), and sending anonymous visitors of
// protected pages to sign-in. Every page, route handler and server action still checks the person and
// role itself (lib/auth/guard.ts).
const PUBLIC = [/^\/$/, /^\/signin(\/|$)/, /^\/bench-check(\/|$)/, /^\/welcome(\/|$)/, /^\/dev\/mailbox(\/|$)/, /^\/forbidden$/, /^\/first-run$/];

export default async function proxy(req: NextRequest) {
  const { pathname, search } = req.nextUrl;
  const e = env();
  const nonce = newNonce();
  const csp = contentSecurityPolicy(nonce, e.NODE_ENV === 'development');
  const headers = new Headers(req.headers);
  headers.set('x-ohm-path', pathname + search);
  headers.set('x-nonce', nonce);
  headers.set('content-security-policy', csp);

  let res: NextResponse;
  if (!PUBLIC.some((re) => re.test(pathname)) && !(await getToken({ req, secret: e.NEXTAUTH_SECRET }))) {
    const url = req.nextUrl.clone();
    url.pathname = '/signin';
    url.search = `?next=${encodeURIComponent(pathname + search)}`;
    res = NextResponse.redirect(url);
  } else {
    res = NextResponse.next({ request: { headers } });
  }
  res.headers.set('content-security-policy', csp);
  if (e.APP_BASE_URL.startsWith('https://')) res.headers.set('strict-transport-security', 'max-age=31536000');
  return res;
}

export const config = {
  matcher: ['/((?!api/|_next/|favicon.ico|robots.txt).*)'],
};
