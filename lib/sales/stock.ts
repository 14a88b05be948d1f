import { sql } from 'kysely';
import type { Db } from '@/db/connect';
import { scoped } from '@/db/scoped';
import { roundQty } from '@/lib/inventory/measure';

export type Shortfall = { partId: string; saleLineId: string; wanted: number; taken: number };

type LineToTake = { id: string; part_id: string; qty: number };

/**
 * Moves the lines of a paid sale off the shelf, one 'sale' movement per line and bin. The part's
 * stock rows are locked (`for update`, in a fixed order so two sales cannot deadlock) before they are
 * read, so the arithmetic below cannot race. When `allowShort` is set (card money already received),
 * a short shelf gives what is there and reports the rest instead of refusing the sale.
 */
export async function takeStock(
  trx: Db,
  input: {
    spaceId: string;
    saleId: string;
    actorId: string | null;
    lines: LineToTake[];
    allowShort: boolean;
    at?: Date;
  },
): Promise<Shortfall[]> {
  const short: Shortfall[] = [];
  const ordered = [...input.lines].sort((a, b) =>
    a.part_id < b.part_id ? -1 : a.part_id > b.part_id ? 1 : 0,
  );
  for (const line of ordered) {
    const rows = await scoped(trx, { spaceId: input.spaceId })
      .selectFrom('stock')
      .select(['location_id', 'qty'])
      .where('space_id', '=', input.spaceId)
      .where('part_id', '=', line.part_id)
      .orderBy('location_id')
      .forUpdate()
      .execute();
    // Fullest bin first: one movement per line whenever one bin holds enough.
    const bins = rows.filter((r) => r.qty > 0).sort((a, b) => b.qty - a.qty);
    let remaining = line.qty;
    let firstBin: string | null = null;
    for (const bin of bins) {
      if (remaining <= 0) break;
      const take = roundQty(Math.min(bin.qty, remaining));
      await scoped(trx, { spaceId: input.spaceId })
        .updateTable('stock')
        .set({ qty: sql`qty - ${take}`, updated_at: sql`now()` })
        .where('part_id', '=', line.part_id)
        .where('location_id', '=', bin.location_id)
        .where('qty', '>=', take)
        .executeTakeFirstOrThrow();
      await scoped(trx, { spaceId: input.spaceId })
        .insertInto('stock_movements')
        .values({
          space_id: input.spaceId,
          part_id: line.part_id,
          location_id: bin.location_id,
          qty_delta: -take,
          reason: 'sale',
          ref_type: 'sale',
          ref_id: input.saleId,
          actor_id: input.actorId,
          ...(input.at ? { created_at: input.at } : {}),
        })
        .execute();
      firstBin ??= bin.location_id;
      // Metres and grams are fractions: kept to three decimals so 0.1 + 0.2 leaves nothing behind.
      remaining = roundQty(remaining - take);
    }
    if (firstBin)
      await scoped(trx, { spaceId: input.spaceId }).updateTable('sale_lines').set({ location_id: firstBin }).where('id', '=', line.id).execute();
    if (remaining > 0) {
      if (!input.allowShort)
        return [{ partId: line.part_id, saleLineId: line.id, wanted: line.qty, taken: roundQty(line.qty - remaining) }];
      short.push({
        partId: line.part_id,
        saleLineId: line.id,
        wanted: line.qty,
        taken: roundQty(line.qty - remaining),
      });
    }
  }
  return short;
}

/** Puts refunded items back on the shelf: into the bin they left from, else the part's fullest bin. */
export async function returnStock(
  trx: Db,
  input: {
    spaceId: string;
    refundId: string;
    actorId: string | null;
    lines: { partId: string; locationId: string | null; qty: number }[];
    at?: Date;
  },
): Promise<{ partId: string; qty: number }[]> {
  const notReturned: { partId: string; qty: number }[] = [];
  for (const line of input.lines) {
    let locationId = line.locationId;
    if (!locationId) {
      const bin = await scoped(trx, { spaceId: input.spaceId })
        .selectFrom('stock')
        .select('location_id')
        .where('space_id', '=', input.spaceId)
        .where('part_id', '=', line.partId)
        .orderBy('qty', 'desc')
        .limit(1)
        .executeTakeFirst();
      locationId = bin?.location_id ?? null;
    }
    if (!locationId) {
      notReturned.push({ partId: line.partId, qty: line.qty });
      continue;
    }
    await scoped(trx, { spaceId: input.spaceId })
      .insertInto('stock')
      .values({ space_id: input.spaceId, part_id: line.partId, location_id: locationId, qty: line.qty })
      .onConflict((oc) =>
        oc
          .columns(['part_id', 'location_id'])
          .doUpdateSet({ qty: sql`stock.qty + ${line.qty}`, updated_at: sql`now()` }),
      )
      .execute();
    await scoped(trx, { spaceId: input.spaceId })
      .insertInto('stock_movements')
      .values({
        space_id: input.spaceId,
        part_id: line.partId,
        location_id: locationId,
        qty_delta: line.qty,
        reason: 'refund',
        ref_type: 'refund',
        ref_id: input.refundId,
        actor_id: input.actorId,
        ...(input.at ? { created_at: input.at } : {}),
      })
      .execute();
  }
  return notReturned;
}
