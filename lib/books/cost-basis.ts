import 'server-only';
import type { Db } from '@/db/connect';
import { scoped } from '@/db/scoped';
import type { Ctx } from '@/lib/auth/roles';
import type { CostBasis } from './unit-cost';

/**
 * What each part's cost can be told from (lib/books/unit-cost.ts): its receipt lines received before
 * `until`, oldest first, and its preferred offer. Parts with neither are absent (cost unknown).
 */
export async function costBases(db: Db, ctx: Pick<Ctx, 'spaceId'>, partIds: string[], until: Date): Promise<Map<string, CostBasis>> {
  const ids = [...new Set(partIds)];
  const out = new Map<string, CostBasis>();
  if (!ids.length) return out;
  const [received, offers] = await Promise.all([
    scoped(db, ctx)
      .selectFrom('order_receipt_lines')
      .innerJoin('order_receipts', 'order_receipts.id', 'order_receipt_lines.receipt_id')
      .select(['order_receipt_lines.part_id', 'order_receipts.received_at', 'order_receipt_lines.units', 'order_receipt_lines.cost_minor'])
      .where('order_receipt_lines.part_id', 'in', ids)
      .where('order_receipts.received_at', '<', until)
      .orderBy('order_receipts.received_at')
      .orderBy('order_receipt_lines.id')
      .execute(),
    scoped(db, ctx)
      .selectFrom('supplier_offers')
      .select(['part_id', 'pack_size', 'pack_price_minor'])
      .where('part_id', 'in', ids)
      .where('preferred', '=', true)
      .execute(),
  ]);
  const basis = (partId: string) => {
    const b = out.get(partId) ?? { received: [], offer: null };
    out.set(partId, b);
    return b;
  };
  for (const r of received)
    basis(r.part_id).received.push({ at: r.received_at, units: Number(r.units), costMinor: r.cost_minor });
  for (const o of offers) basis(o.part_id).offer = { packSize: Number(o.pack_size), packPriceMinor: o.pack_price_minor };
  return out;
}
