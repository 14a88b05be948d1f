import 'server-only';
import type { Db } from '@/db/connect';
import { scoped } from '@/db/scoped';
import type { SaleStatus } from '@/db/types';
import { monthRange, spaceClock, type Month } from '@/lib/sales/periods';

export type SaleListRow = {
  id: string;
  status: SaleStatus;
  method: 'card' | 'cash';
  totalMinor: number;
  buyer: string | null;
  createdAt: string;
  paidAt: string | null;
  reversesSaleId: string | null;
  lines: number;
};

/** Every sale of the month (started or paid in it), newest first, for the books. */
export async function salesOfMonth(db: Db, spaceId: string, month: Month): Promise<SaleListRow[]> {
  const { timeZone } = await spaceClock(db, spaceId);
  const { from, to } = monthRange(month, timeZone);
  const rows = await scoped(db, { spaceId })
    .selectFrom('sales')
    .leftJoin('users', 'users.id', 'sales.buyer_id')
    .select([
      'sales.id',
      'sales.status',
      'sales.method',
      'sales.total_minor',
      'sales.created_at',
      'sales.paid_at',
      'sales.reverses_sale_id',
      'users.name',
    ])
    .select((eb) =>
      eb
        .selectFrom('sale_lines')
        .select((e) => e.fn.countAll<number>().as('n'))
        .whereRef('sale_lines.sale_id', '=', 'sales.id')
        .as('lines'),
    )
    .where('sales.space_id', '=', spaceId)
    .where((eb) =>
      eb.or([
        eb.and([eb('sales.created_at', '>=', from), eb('sales.created_at', '<', to)]),
        eb.and([eb('sales.paid_at', '>=', from), eb('sales.paid_at', '<', to)]),
      ]),
    )
    .orderBy('sales.created_at', 'desc')
    .execute();
  return rows.map((r) => ({
    id: r.id,
    status: r.status,
    method: r.method,
    totalMinor: r.total_minor,
    buyer: r.name,
    createdAt: r.created_at.toISOString(),
    paidAt: r.paid_at?.toISOString() ?? null,
    reversesSaleId: r.reverses_sale_id,
    lines: r.lines ?? 0,
  }));
}
