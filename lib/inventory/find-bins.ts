import { codeFromScan } from '@/labels/url';
import { looseNormalize } from '@/labels/code';

// Finding a bin from whatever a steward types or scans at the shelf: its label (scanned URL or the
// code typed with or without separators), or any part of its name or code ("C1", "Bin C1",
// "consumables"). Pure, so the count screen runs it in the browser. Bins whose words match the typed
// words whole come first; then bins that merely contain them.

type Bin = { name: string; code: string | null };

const words = (s: string) =>
  s
    .toLowerCase()
    .normalize('NFKD')
    .replace(/[^\p{L}\p{N}]+/gu, ' ')
    .trim()
    .split(' ')
    .filter(Boolean);

export function findBins<T extends Bin>(bins: T[], typed: string): T[] {
  const text = typed.trim();
  if (!text) return [];
  const scanned = codeFromScan(text);
  if (scanned.ok) {
    const byCode = bins.filter((b) => b.code === scanned.code);
    if (byCode.length) return byCode;
  }
  const asCode = looseNormalize(text).replace(/[^0-9A-Z*~$=]/g, '');
  const wanted = words(text);
  const whole: T[] = [];
  const partial: T[] = [];
  for (const bin of bins) {
    const own = [...words(bin.name), ...(bin.code ? [bin.code.toLowerCase()] : [])];
    const codeHit = Boolean(bin.code && asCode.length >= 4 && bin.code.startsWith(asCode));
    if (wanted.every((w) => own.includes(w))) whole.push(bin);
    else if (codeHit || wanted.every((w) => own.some((o) => o.includes(w)))) partial.push(bin);
  }
  return [...whole, ...partial];
}

/** The one bin meant, when the typing singles it out: a single match, or a single whole-word match. */
export function pickBin<T extends Bin>(bins: T[], typed: string): { bin: T | null; candidates: T[] } {
  const found = findBins(bins, typed);
  if (found.length === 1) return { bin: found[0], candidates: found };
  const wanted = words(typed);
  const whole = found.filter((b) =>
    wanted.every((w) => words(b.name).includes(w) || b.code?.toLowerCase() === w),
  );
  if (whole.length === 1) return { bin: whole[0], candidates: found };
  const exactName = found.filter((b) => words(b.name).join(' ') === wanted.join(' '));
  return { bin: exactName.length === 1 ? exactName[0] : null, candidates: found };
}
