import { DEMO_PASSWORD } from '@/db/seed/people';

// Real HTTP against the production build that scripts/test.sh started; cookies kept per session.
export const BASE = process.env.TEST_BASE_URL ?? 'http://127.0.0.1:3000';

export class HttpSession {
  private cookies = new Map<string, string>();

  /** `base`: another app than the test run's (the production-start test serves its own). */
  constructor(readonly base: string = BASE) {
    this.origin = new URL(base).origin;
  }

  cookieHeader(): string {
    return [...this.cookies].map(([k, v]) => `${k}=${v}`).join('; ');
  }

  private keep(res: Response) {
    for (const c of res.headers.getSetCookie()) {
      const [pair] = c.split(';');
      const i = pair.indexOf('=');
      const name = pair.slice(0, i).trim();
      const value = pair.slice(i + 1).trim();
      if (!value || /max-age=0|expires=thu, 01 jan 1970/i.test(c)) this.cookies.delete(name);
      else this.cookies.set(name, value);
    }
  }

  /** The Origin a browser on the app's own pages sends with a change; null sends none. */
  origin: string | null;

  async fetch(path: string, init: RequestInit = {}): Promise<Response> {
    const headers = new Headers(init.headers);
    if (this.cookies.size) headers.set('cookie', this.cookieHeader());
    const method = (init.method ?? 'GET').toUpperCase();
    if (method !== 'GET' && method !== 'HEAD' && this.origin && !headers.has('origin')) headers.set('origin', this.origin);
    const res = await fetch(path.startsWith('http') ? path : this.base + path, { redirect: 'manual', ...init, headers });
    this.keep(res);
    return res;
  }

  get(path: string) {
    return this.fetch(path);
  }

  post(path: string, body?: unknown, method = 'POST') {
    return this.fetch(path, {
      method,
      headers: { 'content-type': 'application/json' },
      body: body === undefined ? undefined : typeof body === 'string' ? body : JSON.stringify(body),
    });
  }

  postForm(path: string, form: Record<string, string>) {
    return this.fetch(path, {
      method: 'POST',
      headers: { 'content-type': 'application/x-www-form-urlencoded' },
      body: new URLSearchParams(form).toString(),
    });
  }

  /** Signs in through next-auth's own credentials callback, as the browser form does. */
  async signIn(email: string, password = DEMO_PASSWORD): Promise<Response> {
    const csrf = (await (await this.get('/api/auth/csrf')).json()) as { csrfToken: string };
    return this.postForm('/api/auth/callback/password', { csrfToken: csrf.csrfToken, email, password, json: 'true' });
  }

  async signInWithLink(token: string): Promise<Response> {
    const csrf = (await (await this.get('/api/auth/csrf')).json()) as { csrfToken: string };
    return this.postForm('/api/auth/callback/email-link', { csrfToken: csrf.csrfToken, token, json: 'true' });
  }

  async isSignedIn(): Promise<boolean> {
    const s = (await (await this.get('/api/auth/session')).json()) as { user?: unknown };
    return Boolean(s?.user);
  }

  /** Switches the current space the way the header does (cookie read by the guard). */
  useSpace(spaceId: string) {
    this.cookies.set('ohm_space', spaceId);
  }
}

export async function signedIn(email: string, password = DEMO_PASSWORD): Promise<HttpSession> {
  const s = new HttpSession();
  await s.signIn(email, password);
  if (!(await s.isSignedIn())) throw new Error(`test sign-in failed for ${email}`);
  return s;
}

/** Moves the app's clock (only honoured when the app runs with OHM_TEST_HOOKS=1). */
export async function setAppClock(offsetMs: number): Promise<void> {
  const res = await fetch(`${BASE}/api/test/clock`, {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify({ offsetMs }),
  });
  if (!res.ok) throw new Error(`clock hook answered ${res.status}`);
}
