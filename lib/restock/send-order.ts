import 'server-only';
import type { Db } from '@/db/connect';
import { scoped } from '@/db/scoped';
import { audit } from '@/lib/audit/log';
import { hasRole, type Ctx } from '@/lib/auth/roles';
import { now } from '@/lib/clock';
import { formatDate } from '@/lib/format';
import { ConflictError, ForbiddenError, InvalidError } from '@/lib/errors';
import { sendMail } from '@/lib/mail/server';
import { formatMoney } from '@/lib/money';
import { formatQty } from '@/lib/inventory/measure';
import { inTransaction } from '@/lib/inventory/tx';
import { spaceClock } from '@/lib/sales/periods';
import { budgetFigures } from './budget';
import { orderCsv } from './order-csv';
import { findOrder, orderDetail, orderLines } from './orders';
import { findSupplier } from './suppliers';

// Sending an order list: the supplier gets an e-mail through the app's one mail path with the list as a
// CSV attachment, and the list becomes "with the supplier", expected back after the supplier's lead time.
// The mail goes out inside the transaction, before it commits: if the mail server refuses, nothing
// changed (a 503), and the steward can simply send again.
//
// The monthly budget: when what is committed this month plus this list would pass the budget, sending
// needs an admin's approval with a note — given beforehand (approveOrder) or by an admin sending it
// with `approvalNote`. Otherwise a 409 naming approvalNote.

const DAY_MS = 86_400_000;

export async function approveOrder(db: Db, ctx: Ctx, id: string, note: string) {
  if (!hasRole(ctx, 'admin')) throw new ForbiddenError('Only an admin approves spending past the budget.');
  return inTransaction(db, async (trx) => {
    const order = await findOrder(trx, ctx, id, true);
    if (order.state !== 'draft') {
      throw new ConflictError('Only a list not yet sent needs approval.', { state: [`the list is ${order.state}`] });
    }
    await scoped(trx, ctx)
      .updateTable('order_lists')
      .set({ approved_at: now(), approved_by: ctx.userId, approval_note: note })
      .where('id', '=', id)
      .execute();
    await audit(trx, {
      spaceId: ctx.spaceId,
      actorId: ctx.userId,
      action: 'order.approved',
      targetType: 'order_list',
      targetId: id,
      detail: { note },
    });
    return { order: await orderDetail(trx, ctx, id) };
  });
}

export async function sendOrder(db: Db, ctx: Ctx, id: string, input: { approvalNote?: string }) {
  return inTransaction(db, async (trx) => {
    const order = await findOrder(trx, ctx, id, true);
    if (order.state !== 'draft') {
      throw new ConflictError('This list has already been sent.', { state: [`the list is ${order.state}`] });
    }
    const supplier = await findSupplier(trx, ctx, order.supplier_id);
    if (!supplier.email) {
      throw new InvalidError(`${supplier.name} has no contact e-mail; add one under Suppliers first.`, {
        email: ['the supplier has no contact e-mail'],
      });
    }
    const lines = await orderLines(trx, ctx, id);
    const total = lines.reduce((n, l) => n + l.lineTotalMinor, 0);
    const currency = order.currency.trim();
    const budget = await budgetFigures(trx, ctx);
    const over = budget.budgetMinor !== null && budget.committedMinor + total > budget.budgetMinor;
    let approval: { note: string } | null = null;
    if (over && !order.approved_at) {
      const note = input.approvalNote?.trim() ?? '';
      if (!hasRole(ctx, 'admin') || note.length < 3) {
        const left = Math.max(0, budget.budgetMinor! - budget.committedMinor);
        throw new ConflictError(
          `This list (${formatMoney(total, currency)}) is more than is left of this month’s restocking budget (${formatMoney(left, currency)} of ${formatMoney(budget.budgetMinor!, currency)}). An admin must approve it with a note.`,
          { approvalNote: [hasRole(ctx, 'admin') ? 'say why (at least 3 characters) to approve it' : 'an admin must approve this list'] },
        );
      }
      approval = { note };
    }
    const at = now();
    const expected = new Date(at.getTime() + supplier.lead_days * DAY_MS);
    await scoped(trx, ctx)
      .updateTable('order_lists')
      .set({
        state: 'sent',
        sent_at: at,
        sent_by: ctx.userId,
        expected_at: expected,
        ...(approval ? { approved_at: at, approved_by: ctx.userId, approval_note: approval.note } : {}),
      })
      .where('id', '=', id)
      .execute();
    await audit(trx, {
      spaceId: ctx.spaceId,
      actorId: ctx.userId,
      action: 'order.sent',
      targetType: 'order_list',
      targetId: id,
      detail: { to: supplier.email, totalMinor: total, currency, overBudget: over, approvalNote: approval?.note ?? null },
    });
    const { timeZone } = await spaceClock(trx, ctx.spaceId);
    const ref = id.slice(0, 8).toUpperCase();
    const text = [
      `Hello ${supplier.name},`,
      '',
      `${ctx.spaceName} would like to order the following (order list ${ref}, ${formatDate(at, timeZone)}):`,
      '',
      ...lines.map(
        (l) =>
          `- ${l.packs} × pack of ${formatQty(l.packSize, l.saleUnit)}: ${l.partName}${l.itemRef ? ` (your ref. ${l.itemRef})` : ''} — ${formatMoney(l.lineTotalMinor, currency)}`,
      ),
      '',
      `Total as listed: ${formatMoney(total, currency)} (${currency}).`,
      order.note ? `\nNote: ${order.note}` : '',
      'The same list is attached as a CSV file.',
      '',
      `Thank you,\n${ctx.name}, ${ctx.spaceName}`,
    ].join('\n');
    await sendMail({
      to: supplier.email,
      subject: `Order ${ref} from ${ctx.spaceName}`,
      text,
      attachments: [{ filename: `order-${ref}.csv`, contentType: 'text/csv', content: orderCsv(lines, currency) }],
    });
    return { order: await orderDetail(trx, ctx, id) };
  });
}
