import 'server-only';
import type { Db } from '@/db/connect';
import { scoped } from '@/db/scoped';
import type { Ctx } from '@/lib/auth/roles';
import type { PartCategory } from '@/lib/domain';
import { measureOf } from '@/lib/inventory/measure';
import type { FilingWriteOff } from '@/lib/reconcile/filing';
import { costBases } from './cost-basis';
import { costOf, costSourceWords, unitCostAt } from './unit-cost';

// Stock written off in a period, at cost. Where losses are recorded (one stock movement each):
//   - hand adjustments on the shelf (`adjust`, `lost`, `damaged`; lib/inventory/stock.ts),
//   - bin counts posted (`count`, the difference found; lib/inventory/counts.ts),
//   - units retired (`retire`, −1; lib/inventory/units.ts, box upkeep),
//   - counted parts a box lost or came back short of (`lost` / `damaged`, − the units; returns, upkeep),
//   - units a borrower lost, or damaged and was charged for (issue 16): the return retires the unit but
//     writes its movement with 0 units (units are not counted stock), so such a movement counts as one
//     unit here. A damaged unit nobody was charged for waits for repair and is not a loss (yet): if it is
//     retired later, that retirement is the write-off.
// Each is valued at the price per unit that held at that moment (lib/books/unit-cost.ts).

export const WRITE_OFF_REASONS = ['lost', 'damaged', 'retire', 'count', 'adjust'] as const;

export async function writeOffsAtCost(
  db: Db,
  ctx: Pick<Ctx, 'spaceId'>,
  { from, to }: { from: Date; to: Date },
  codeOf: (c: PartCategory) => string,
): Promise<FilingWriteOff[]> {
  const moves = await scoped(db, ctx)
    .selectFrom('stock_movements')
    .innerJoin('parts', 'parts.id', 'stock_movements.part_id')
    .select([
      'stock_movements.created_at',
      'stock_movements.reason',
      'stock_movements.qty_delta',
      'stock_movements.unit_id',
      'stock_movements.ref_type',
      'stock_movements.ref_id',
      'stock_movements.note',
      'stock_movements.part_id',
      'parts.name',
      'parts.category',
      'parts.sale_unit',
    ])
    .where('stock_movements.reason', 'in', WRITE_OFF_REASONS)
    .where((eb) =>
      eb.or([
        eb('stock_movements.qty_delta', '!=', 0),
        eb.and([eb('stock_movements.unit_id', 'is not', null), eb('stock_movements.reason', 'in', ['lost', 'damaged'])]),
      ]),
    )
    .where('stock_movements.created_at', '>=', from)
    .where('stock_movements.created_at', '<', to)
    .orderBy('stock_movements.created_at')
    .orderBy('stock_movements.id')
    .execute();

  // Damaged units on a return: a write-off only when the borrower was charged for the damage.
  const loans = [...new Set(moves.filter((m) => m.unit_id && m.reason === 'damaged' && m.ref_type === 'loan' && m.ref_id).map((m) => m.ref_id!))];
  const charged = new Set<string>();
  if (loans.length) {
    const rows = await scoped(db, ctx)
      .selectFrom('charges')
      .innerJoin('loan_lines', 'loan_lines.id', 'charges.loan_line_id')
      .select(['loan_lines.loan_id', 'loan_lines.unit_id'])
      .where('charges.kind', '=', 'damaged')
      .where('loan_lines.loan_id', 'in', loans)
      .where('loan_lines.unit_id', 'is not', null)
      .execute();
    for (const r of rows) charged.add(`${r.loan_id}:${r.unit_id}`);
  }
  const kept = moves.filter(
    (m) => Number(m.qty_delta) !== 0 || m.reason === 'lost' || charged.has(`${m.ref_id}:${m.unit_id}`),
  );

  const bases = await costBases(db, ctx, kept.map((m) => m.part_id), to);
  return kept.map((m) => {
    const delta = Number(m.qty_delta);
    const qty = delta !== 0 ? -delta : 1;
    const unit = unitCostAt(bases.get(m.part_id), m.created_at);
    return {
      at: m.created_at,
      reason: m.reason,
      part: m.name,
      category: m.category,
      accountCode: codeOf(m.category),
      unit: measureOf(m.sale_unit),
      qtyDelta: delta,
      qty,
      costMinor: unit ? costOf(qty, unit) : null,
      costBasis: costSourceWords(unit),
      note: m.note,
    };
  });
}
