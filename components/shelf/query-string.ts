import type { PartListQuery } from '@/lib/inventory/schemas';

const DEFAULTS: Partial<Record<keyof PartListQuery, string>> = {
  sort: 'name',
  dir: 'asc',
  page: '1',
  pageSize: '50',
};

/** The table's state as a query string, leaving out defaults so links stay short. */
export function partsQueryString(q: Partial<PartListQuery>, drop: (keyof PartListQuery)[] = []): string {
  const params = new URLSearchParams();
  for (const [k, v] of Object.entries(q) as [keyof PartListQuery, unknown][]) {
    if (drop.includes(k) || v === undefined || v === '' || v === false) continue;
    const s = v === true ? '1' : String(v);
    if (DEFAULTS[k] === s) continue;
    params.set(k, s);
  }
  return params.toString();
}
