import { NextResponse, type NextRequest } from 'next/server';
import { getToken } from 'next-auth/jwt';

// Only redirects anonymous visitors of protected pages to sign-in; every page, route handler and
// server action still checks the person and role itself (lib/auth/guard.ts).
const PUBLIC = [/^\/$/, /^\/signin(\/|$)/, /^\/bench-check(\/|$)/, /^\/welcome(\/|$)/, /^\/dev\/mailbox(\/|$)/, /^\/forbidden$/];

export default async function proxy(req: NextRequest) {
  const { pathname, search } = req.nextUrl;
  const headers = new Headers(req.headers);
  headers.set('x-ohm-path', pathname + search);
  if (!PUBLIC.some((re) => re.test(pathname))) {
    const token = await getToken({ req, secret: process.env.NEXTAUTH_SECRET });
    if (!token) {
      const url = req.nextUrl.clone();
      url.pathname = '/signin';
      url.search = `?next=${encodeURIComponent(pathname + search)}`;
      return NextResponse.redirect(url);
    }
  }
  return NextResponse.next({ request: { headers } });
}

export const config = {
  matcher: ['/((?!api/|_next/|favicon.ico|robots.txt).*)'],
};
