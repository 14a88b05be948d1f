// The Content-Security-Policy for every page, built per request around a fresh nonce (proxy.ts). Next
// reads the nonce from the request's CSP header and puts it on its own scripts; no inline script runs
// without it ('strict-dynamic' lets those scripts load the chunks they need). Styles may be inline
// (React style attributes, chart libraries); scripts may not.
export function contentSecurityPolicy(nonce: string, dev = false): string {
  return [
    `default-src 'self'`,
    `script-src 'self' 'nonce-${nonce}' 'strict-dynamic'${dev ? ` 'unsafe-eval'` : ''}`,
    `style-src 'self' 'unsafe-inline'`,
    `img-src 'self' data: blob:`,
    `font-src 'self' data:`,
    `connect-src 'self'`,
    `media-src 'self' blob:`,
    `worker-src 'self' blob:`,
    `object-src 'none'`,
    `base-uri 'self'`,
    `frame-ancestors 'none'`,
  ].join('; ');
}

/** 128 random bits, base64: a nonce no page can guess. */
export function newNonce(): string {
  const bytes = crypto.getRandomValues(new Uint8Array(16));
  return btoa(String.fromCharCode(...bytes));
}
