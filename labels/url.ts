// The URL a label's QR carries, and the way back from whatever a scanner read to a code.
// Pure module (no qrcode import) so the scan page can use it without loading a QR encoder.
import { verifyCode, type CodeCheck } from './code';

/** Path prefix of the scan route: `<base>/s/<code>`. */
export const SCAN_PATH = '/s/';

/**
 * `<base>/s/<code>` with the code in its canonical form.
 *
 * The check symbols * ~ $ = U go into the path as they are, not percent-encoded. RFC 3986 §3.3 allows
 * unreserved characters (~) and sub-delims (* $ =) literally in a path segment, and the WHATWG URL
 * parser that browsers and phone cameras use leaves all four untouched (tests/unit/labels pins that),
 * so the URL a phone shows before opening reads exactly like the code printed beside the QR.
 * `encodeURIComponent` would have turned `$` into %24 and `=` into %3D for no gain. The way back
 * (`codeFromScan`) decodes percent escapes anyway, so a scanner or proxy that does encode them still lands.
 */
export function labelUrl(base: string, code: string): string {
  let url: URL;
  try {
    url = new URL(base);
  } catch {
    throw new RangeError(`labelUrl: base is not an absolute URL: ${JSON.stringify(base)}`);
  }
  if (url.protocol !== 'https:' && url.protocol !== 'http:') {
    throw new RangeError('labelUrl: base must be http(s)');
  }
  if (url.search || url.hash) throw new RangeError('labelUrl: base must not carry a query or fragment');
  const checked = verifyCode(code);
  if (!checked.ok) throw new RangeError(`labelUrl: ${checked.message}`);
  return `${url.origin}${url.pathname.replace(/\/+$/, '')}${SCAN_PATH}${checked.code}`;
}

/**
 * What a scanner read (a full label URL from the camera, or the bare code a USB scanner or a person
 * typed) → the verified code. Foreign URLs are read by their last `/s/<segment>` only; the lookup
 * behind it is scoped to the caller's space anyway.
 */
export function codeFromScan(text: string): CodeCheck {
  const trimmed = text.trim();
  if (!/^[a-z][a-z0-9+.-]*:\/\//i.test(trimmed)) return verifyCode(trimmed);
  let segment = '';
  try {
    const match = /\/s\/([^/]+)\/?$/.exec(new URL(trimmed).pathname);
    segment = match ? decodeURIComponent(match[1]) : '';
  } catch {
    // A malformed URL or percent escape: fall through to the empty-code answer.
  }
  return verifyCode(segment);
}
