// The one rule for every "where to after sign-in" value (the sign-in page's `next`, the sign-in form,
// next-auth's redirect callback, the e-mail link page): only a path of this site, decided by parsing it
// as a URL, never by looking at its first characters alone. Pure; runs in the browser too.

export const HOME_PATH = '/today';

// Placeholder origin to parse against: a value that leaves it names another site.
const PROBE = 'http://ohmstead.invalid';
// C0 controls and DEL: browsers drop tabs and newlines inside URLs, so "/\t/evil" becomes "//evil".
const CONTROL = /[\u0000-\u001f\u007f]/;

function plainPath(v: string): boolean {
  return v.startsWith('/') && !v.startsWith('//') && !v.includes('\\') && !CONTROL.test(v);
}

/** `raw` when it is a path of this site (normalised), else the home page. */
export function safeNextPath(raw: unknown, fallback: string = HOME_PATH): string {
  if (typeof raw !== 'string' || raw.length === 0 || raw.length > 2048) return fallback;
  let decoded: string;
  try {
    decoded = decodeURIComponent(raw);
  } catch {
    return fallback; // a malformed escape
  }
  // The decoded form too: %5C and %2F%2F become \ and // in some browsers and proxies.
  if (!plainPath(raw) || !plainPath(decoded)) return fallback;
  let url: URL;
  try {
    url = new URL(raw, PROBE);
  } catch {
    return fallback;
  }
  if (url.origin !== PROBE) return fallback;
  const path = url.pathname + url.search + url.hash;
  return plainPath(path) ? path : fallback;
}

/**
 * For next-auth's redirect callback: an absolute URL on `baseUrl`'s origin. A relative path, or an
 * absolute URL of this very origin, keeps its path when safe; anything else goes to the home page.
 */
export function safeCallbackUrl(url: string, baseUrl: string): string {
  const base = new URL(baseUrl);
  let path: unknown = url;
  if (!url.startsWith('/')) {
    try {
      const abs = new URL(url);
      path = abs.origin === base.origin ? abs.pathname + abs.search + abs.hash : null;
    } catch {
      path = null;
    }
  }
  return base.origin + safeNextPath(path);
}
