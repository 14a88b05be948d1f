// Decodes the processor's form encoding: bracket notation (`line_items[0][price_data][unit_amount]=500`,
// `expand[]=data.source`) into nested objects and arrays. Values stay strings; schemas coerce them.
export type FormValue = string | FormValue[] | { [key: string]: FormValue };
export type FormObject = { [key: string]: FormValue };

function keySegments(key: string): string[] {
  const open = key.indexOf('[');
  if (open <= 0) return [key];
  const segments = [key.slice(0, open)];
  const rest = key.slice(open);
  const re = /\[([^\]]*)\]/g;
  for (let m = re.exec(rest); m; m = re.exec(rest)) segments.push(m[1]);
  return segments;
}

// Objects whose keys are all indices (or pushed with `[]`) become arrays, in index order.
function arrayify(value: FormValue): FormValue {
  if (typeof value === 'string' || Array.isArray(value)) return value;
  const keys = Object.keys(value);
  const entries = keys.map((k) => [k, arrayify(value[k])] as const);
  if (keys.length > 0 && keys.every((k) => /^\d+$/.test(k) || k.startsWith('\u0000'))) {
    return entries
      .map(([k, v]) => ({ index: k.startsWith('\u0000') ? Number(k.slice(1)) + 1e9 : Number(k), v }))
      .sort((a, b) => a.index - b.index)
      .map((e) => e.v);
  }
  return Object.fromEntries(entries);
}

export function parseForm(text: string): FormObject {
  const root: { [key: string]: FormValue } = {};
  let pushed = 0;
  for (const [key, value] of new URLSearchParams(text)) {
    const segments = keySegments(key);
    let node: { [key: string]: FormValue } = root;
    segments.forEach((raw, i) => {
      // `[]` appends: give it a unique key that sorts after explicit indices.
      const seg = raw === '' ? `\u0000${pushed++}` : raw;
      if (i === segments.length - 1) {
        node[seg] = value;
        return;
      }
      const next = node[seg];
      if (typeof next !== 'object' || next === null || Array.isArray(next)) node[seg] = {};
      node = node[seg] as { [key: string]: FormValue };
    });
  }
  return arrayify(root) as FormObject;
}

/** `['line_items', 0, 'quantity']` → `line_items[0][quantity]`, the way the processor names a param. */
export function bracketPath(path: readonly PropertyKey[]): string {
  return path.map((p, i) => (i === 0 ? String(p) : `[${String(p)}]`)).join('');
}
