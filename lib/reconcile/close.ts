import 'server-only';
import type { Db } from '@/db/connect';
import { scoped } from '@/db/scoped';
import { hasRole, type Ctx } from '@/lib/auth/roles';
import { audit } from '@/lib/audit/log';
import { now } from '@/lib/clock';
import { ConflictError, ForbiddenError, InvalidError } from '@/lib/errors';
import { monthKey, monthRange, spaceClock, type Month } from '@/lib/sales/periods';
import { isUnresolved, type Reconciliation } from './report';

/**
 * Closes a month that has ended. From then on no sale of that month changes: a refund of one of its
 * sales is booked on a reversing entry in the open month (lib/sales/refunds.ts), a late payment lands
 * in the open month (lib/sales/paid.ts). The reconciliation's totals are kept with the closing.
 */
export async function closeMonth(
  db: Db,
  ctx: Ctx,
  month: Month,
  report: Reconciliation,
  /** How many unresolved rows the treasurer agreed to close with; must equal the count found now. */
  confirmUnresolved?: number,
): Promise<{ month: Month; closedAt: string }> {
  if (!hasRole(ctx, 'treasurer')) throw new ForbiddenError('Only the treasurer closes the books.');
  if (report.month !== month)
    throw new InvalidError('Check month.', { month: ['The reconciliation is for another month.'] });
  const { timeZone } = await spaceClock(db, ctx.spaceId);
  if (monthRange(month, timeZone).to > now())
    throw new InvalidError('Check month.', { month: ['Only a month that has ended can be closed.'] });
  const unresolved = report.rows.filter(isUnresolved);
  if (unresolved.length > 0 && confirmUnresolved !== unresolved.length) {
    const listed = unresolved
      .slice(0, 10)
      .map((r) => `${r.saleRef ?? r.kind} (${r.status.replace('_', ' ')})`)
      .join(', ');
    const more = unresolved.length > 10 ? `, and ${unresolved.length - 10} more` : '';
    throw new ConflictError(
      `${unresolved.length} ${unresolved.length === 1 ? 'row does' : 'rows do'} not match and have no note: ${listed}${more}. Explain them, or confirm closing with ${unresolved.length} unresolved.`,
      { confirmUnresolved: [`Send ${unresolved.length} to close with them unresolved.`] },
    );
  }
  return db.transaction().execute(async (trx) => {
    const pending = await scoped(trx, ctx)
      .selectFrom('sales')
      .select((eb) => eb.fn.countAll<number>().as('n'))
      .where('space_id', '=', ctx.spaceId)
      .where('status', '=', 'pending')
      .where('created_at', '<', monthRange(month, timeZone).to)
      .executeTakeFirstOrThrow();
    if (pending.n > 0)
      throw new ConflictError(
        `${pending.n} card sales of this month or before still wait for the processor; settle them first.`,
      );
    const summary = {
      ...report.totals,
      rows: report.rows.length,
      payouts: report.payouts.length,
      unresolved: unresolved.map((r) => r.key),
    };
    const row = await scoped(trx, ctx)
      .insertInto('closed_periods')
      .values({
        space_id: ctx.spaceId,
        month: monthKey(month),
        closed_by: ctx.userId,
        closed_at: now(),
        summary: JSON.stringify(summary),
      })
      .onConflict((oc) => oc.columns(['space_id', 'month']).doNothing())
      .returning('closed_at')
      .executeTakeFirst();
    if (!row) throw new ConflictError(`${month} is already closed.`);
    await audit(trx, {
      spaceId: ctx.spaceId,
      actorId: ctx.userId,
      action: 'books.month_closed',
      targetType: 'period',
      targetId: month,
      detail: summary,
    });
    return { month, closedAt: row.closed_at.toISOString() };
  });
}
