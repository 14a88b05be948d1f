// Pulls the web links out of a message so the dev mailbox (and tests) can follow them.
// Only http(s) links are returned: a `javascript:` href in a message must never become a live link.

const HREF = /\bhref\s*=\s*(?:"([^"]*)"|'([^']*)'|([^\s>]+))/gi;
const BARE_URL = /https?:\/\/[^\s<>"'`]+/gi;
const TRAILING_PUNCTUATION = /[.,;:!?)\]}]+$/;

const NAMED_ENTITIES: Record<string, string> = { amp: '&', lt: '<', gt: '>', quot: '"', apos: "'" };

/** Decodes the HTML character references that can appear inside an attribute value. */
function decodeEntities(value: string): string {
  return value.replace(/&(#x[0-9a-f]+|#[0-9]+|[a-z]+);/gi, (whole, ref: string) => {
    if (ref[0] === '#') {
      const code = ref[1] === 'x' || ref[1] === 'X' ? parseInt(ref.slice(2), 16) : parseInt(ref.slice(1), 10);
      return Number.isFinite(code) && code <= 0x10ffff ? String.fromCodePoint(code) : whole;
    }
    return NAMED_ENTITIES[ref.toLowerCase()] ?? whole;
  });
}

function isWebLink(candidate: string): boolean {
  try {
    const url = new URL(candidate);
    return url.protocol === 'http:' || url.protocol === 'https:';
  } catch {
    return false;
  }
}

/** Unique http(s) links, those from the HTML part first, in order of appearance. */
export function extractLinks(message: { text: string; html: string | null }): string[] {
  const found: string[] = [];
  for (const m of (message.html ?? '').matchAll(HREF)) {
    found.push(decodeEntities((m[1] ?? m[2] ?? m[3] ?? '').trim()));
  }
  for (const m of message.text.matchAll(BARE_URL)) {
    found.push(m[0].replace(TRAILING_PUNCTUATION, ''));
  }
  return [...new Set(found.filter(isWebLink))];
}
