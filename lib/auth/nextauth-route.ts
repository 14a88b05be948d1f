import 'server-only';
import NextAuth from 'next-auth';
import { NextRequest, NextResponse } from 'next/server';
import { errorBody, errorResponse } from '@/lib/http/respond';
import { authOptions } from './options';
import { safeCallbackUrl } from './safe-next';

// The next-auth catch-all (/api/auth/...), fenced: next-auth answers 500 to some junk (a JSON or
// malformed body, a callback URL that is not a URL), so only its real actions and body types get
// through, callback URLs pass the same-origin rule first, and anything it still fails on is a 4xx.

const nextAuth = NextAuth(authOptions);
// A provider's own id is in its options (CredentialsProvider's top-level id is the generic "credentials").
const PROVIDERS = new Set(authOptions.providers.map((p) => (p as { options?: { id?: string } }).options?.id ?? p.id));
/** Actions next-auth serves, per method; `withProvider` ones take a provider id as their second segment. */
const ACTIONS: Record<string, Set<string>> = {
  GET: new Set(['session', 'csrf', 'providers', 'signin', 'signout', 'error', 'verify-request']),
  POST: new Set(['session', 'signin', 'signout', 'callback', '_log']),
};
const withProvider = new Set(['signin', 'callback']);
/** Its client posts forms everywhere, and JSON only to these two. */
const JSON_OK = new Set(['session', '_log']);
const CALLBACK_COOKIES = ['next-auth.callback-url', '__Secure-next-auth.callback-url'];

type Params = { params: Promise<{ nextauth?: string[] }> };

const refuse = (status: number, code: string, message: string) =>
  NextResponse.json(errorBody(code, message), { status });

export async function authRoute(req: NextRequest, { params }: Params): Promise<Response> {
  try {
    const segments = (await params).nextauth ?? [];
    const [action = '', provider, ...extra] = segments;
    const known =
      ACTIONS[req.method]?.has(action) &&
      extra.length === 0 &&
      (provider === undefined ? action !== 'callback' : withProvider.has(action) && PROVIDERS.has(provider));
    if (!known) return refuse(404, 'not_found', 'No such sign-in address.');

    const url = new URL(req.url);
    const cb = url.searchParams.get('callbackUrl');
    if (cb !== null) url.searchParams.set('callbackUrl', safeCallbackUrl(cb, url.origin));

    let body: string | undefined;
    if (req.method === 'POST') {
      const type = (req.headers.get('content-type') ?? '').split(';')[0].trim().toLowerCase();
      const text = await req.text();
      if (text === '') {
        body = undefined; // nothing to read: next-auth answers it as a form without its fields
      } else if (type === 'application/x-www-form-urlencoded') {
        const form = new URLSearchParams(text);
        const formCb = form.get('callbackUrl');
        if (formCb !== null) form.set('callbackUrl', safeCallbackUrl(formCb, url.origin));
        body = form.toString();
      } else if (type === 'application/json' && JSON_OK.has(action)) {
        let parsed: unknown;
        try {
          parsed = JSON.parse(text);
        } catch {
          return refuse(400, 'invalid', 'The body is not valid JSON.');
        }
        if (!parsed || typeof parsed !== 'object' || Array.isArray(parsed))
          return refuse(400, 'invalid', 'The body must be a JSON object.');
        body = JSON.stringify(parsed);
      } else {
        return refuse(415, 'invalid', 'Send this form as application/x-www-form-urlencoded.');
      }
    }
    const headers = new Headers(req.headers);
    headers.delete('content-length');
    const forwarded = new NextRequest(url, { method: req.method, headers, body });
    const res = await nextAuth(forwarded, { params: Promise.resolve({ nextauth: segments }) });
    if (res.status < 500) return res;
    // What next-auth still refuses with a 500 is its check of the request (e.g. a callback-url cookie
    // that is not a URL of this site): the request's fault. Answer 400 and drop that cookie.
    const refused = refuse(400, 'invalid', 'This sign-in request could not be handled; reload the page and try again.');
    for (const name of CALLBACK_COOKIES) if (req.cookies.has(name)) refused.cookies.delete(name);
    return refused;
  } catch (err) {
    return errorResponse(err);
  }
}
