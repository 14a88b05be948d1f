// Fitting label text into a box with pdf-lib's standard fonts: they encode WinAnsi only, so text is
// first folded into what the font can draw, then truncated or wrapped by measured width.
import type { PDFFont } from 'pdf-lib';

const ELLIPSIS = '…';

// Characters parts are often described with that WinAnsi lacks, spelled so a reader still understands.
const SPELLED: Record<string, string> = {
  Ω: ' ohm',
  '−': '-',
  '≤': '<=',
  '≥': '>=',
  '→': '->',
  '≈': '~',
  '\u00a0': ' ',
  '\u202f': ' ',
};

const charsetCache = new WeakMap<PDFFont, Set<number>>();

/** The text with every character the font cannot encode replaced (spelled out, else '?'). */
export function drawable(font: PDFFont, text: string): string {
  let charset = charsetCache.get(font);
  if (!charset) {
    charset = new Set(font.getCharacterSet());
    charsetCache.set(font, charset);
  }
  let out = '';
  for (const ch of text.replace(/\s+/g, ' ')) {
    if (charset.has(ch.codePointAt(0) as number)) out += ch;
    else out += SPELLED[ch] ?? '?';
  }
  return out.replace(/ {2,}/g, ' ').trim();
}

/**
 * `text` itself if it fits in `maxWidth`; else its longest run of whole words that fits with an ellipsis
 * ("Constant-current buck driver…", never "buck driver, 1000 m"). Trailing punctuation goes before the
 * ellipsis. Only a single word wider than the box is cut inside the word.
 */
export function truncateToWidth(font: PDFFont, text: string, size: number, maxWidth: number): string {
  if (font.widthOfTextAtSize(text, size) <= maxWidth) return text;
  let lo = 0;
  let hi = text.length;
  while (lo < hi) {
    const mid = Math.ceil((lo + hi) / 2);
    if (font.widthOfTextAtSize(text.slice(0, mid).trimEnd() + ELLIPSIS, size) <= maxWidth) lo = mid;
    else hi = mid - 1;
  }
  if (lo === 0) return '';
  let kept = text.slice(0, lo);
  if (text[lo] !== ' ' && !/\s$/.test(kept)) {
    const space = kept.lastIndexOf(' ');
    if (space > 0) kept = kept.slice(0, space);
  }
  kept = kept.replace(/[\s,;:·–-]+$/u, '');
  return (kept || text.slice(0, lo).trimEnd()) + ELLIPSIS;
}

/** Longest prefix (in characters) that fits without an ellipsis; at least one character. */
function fittingPrefix(font: PDFFont, text: string, size: number, maxWidth: number): number {
  let n = 1;
  while (n < text.length && font.widthOfTextAtSize(text.slice(0, n + 1), size) <= maxWidth) n++;
  return n;
}

/**
 * Greedy word wrap into at most `maxLines` lines; the last line is truncated with an ellipsis.
 * A single word wider than the box is broken mid-word rather than pushed off the label.
 */
export function wrapToWidth(
  font: PDFFont,
  text: string,
  size: number,
  maxWidth: number,
  maxLines: number,
): string[] {
  const lines: string[] = [];
  let rest = text.trim();
  while (rest && lines.length < maxLines - 1) {
    if (font.widthOfTextAtSize(rest, size) <= maxWidth) break;
    const words = rest.split(' ');
    let line = words[0];
    let used = 1;
    while (used < words.length && font.widthOfTextAtSize(`${line} ${words[used]}`, size) <= maxWidth) {
      line += ` ${words[used++]}`;
    }
    if (font.widthOfTextAtSize(line, size) > maxWidth) {
      line = line.slice(0, fittingPrefix(font, line, size, maxWidth));
      rest = rest.slice(line.length).trim();
    } else {
      rest = words.slice(used).join(' ');
    }
    lines.push(line);
  }
  if (rest) lines.push(truncateToWidth(font, rest, size, maxWidth));
  return lines;
}
