import { suggestCodes, verifyCode } from '@/labels/code';
import type { CatalogItem } from '@/lib/sales/catalog';

export type Lookup = { item: CatalogItem } | { message: string };

/**
 * What a scanned or typed label means at the counter. A phone camera reads the label's QR as a URL
 * (`…/s/<code>`), a USB scanner types the code, a person may type it with a hyphen or a slip, or type
 * the SKU printed beside it.
 */
export function lookupCode(input: string, items: CatalogItem[]): Lookup {
  const raw = input.trim();
  if (!raw) return { message: 'Type or scan a label code.' };
  const fromUrl = /\/s\/([^/?#\s]+)/.exec(raw)?.[1];
  const text = fromUrl ? decodeURIComponent(fromUrl) : raw;
  const bySku = items.find((i) => i.sku.toLowerCase() === text.toLowerCase());
  if (bySku) return { item: bySku };
  const checked = verifyCode(text);
  if (!checked.ok) {
    const near = suggestCodes(text)
      .map((c) => items.find((i) => i.code === c))
      .filter((i): i is CatalogItem => Boolean(i));
    if (near.length === 1) return { message: `${checked.message} Did you mean ${near[0].name}?` };
    return { message: checked.message };
  }
  const item = items.find((i) => i.code === checked.code);
  return item
    ? { item }
    : { message: 'That label is not something the counter sells (a bin or a loan item?).' };
}
