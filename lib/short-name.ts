/** "Ada Lindqvist" → "Ada L.": enough to tell people apart on a button without the full name. */
export function shortName(full: string): string {
  const parts = full.trim().split(/\s+/).filter(Boolean);
  if (parts.length <= 1) return parts[0] ?? '';
  const last = parts[parts.length - 1];
  return `${parts[0]} ${Array.from(last)[0].toUpperCase()}.`;
}
