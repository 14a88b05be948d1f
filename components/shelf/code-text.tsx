import { formatCode } from '@/labels/code';

/** A label code as printed (K7F2-QX9), in a monospaced face; a code that does not verify shows as stored. */
export function CodeText({ code }: { code: string | null }) {
  if (!code) return <span className="muted">—</span>;
  let shown = code;
  try {
    shown = formatCode(code);
  } catch {
    // Older or foreign codes: show them as they are.
  }
  return <span className="font-mono whitespace-nowrap">{shown}</span>;
}
