// A report goes out only when every number in it is a finite number: NaN, ±Infinity and null (what
// JSON.stringify makes of both) would read as figures to a person or a program.

/** The dotted path of the first value that is not a finite number or plain data, or null when all are. */
export function firstNonFinite(value: unknown, path = ''): string | null {
  if (value === null) return path || '(root)';
  if (typeof value === 'number') return Number.isFinite(value) ? null : path || '(root)';
  if (Array.isArray(value)) {
    for (let i = 0; i < value.length; i++) {
      const bad = firstNonFinite(value[i], path ? `${path}.${i}` : String(i));
      if (bad) return bad;
    }
    return null;
  }
  if (typeof value === 'object') {
    for (const [k, v] of Object.entries(value as Record<string, unknown>)) {
      if (v === undefined) continue; // left out of the JSON, not a figure
      const bad = firstNonFinite(v, path ? `${path}.${k}` : k);
      if (bad) return bad;
    }
  }
  return null;
}
