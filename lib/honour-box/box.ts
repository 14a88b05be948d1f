import 'server-only';
import { sql } from 'kysely';
import type { Db } from '@/db/connect';
import { scoped } from '@/db/scoped';
import { audit } from '@/lib/audit/log';
import { hasRole, isStaff, type Ctx } from '@/lib/auth/roles';
import { now } from '@/lib/clock';
import { ConflictError, ForbiddenError, InvalidError, NotFoundError } from '@/lib/errors';
import { formatMoney } from '@/lib/money';
import { spaceClock } from '@/lib/sales/periods';
import { boxBankingInput, boxCountInput, type BoxBankingInput, type BoxCountInput } from './schemas';

// What should be in the box: what was left in it after the last count (counted, less what was banked
// from that count), plus every cash sale paid since that count, less cash given back since. Cash sales
// rung up by a steward go into the same box as members' own honour-box purchases.

export type BoxExpectation = {
  currency: string;
  since: Date | null;
  carriedMinor: number;
  cashSalesMinor: number;
  cashRefundsMinor: number;
  expectedMinor: number;
};

export type BoxCount = {
  id: string;
  countedAt: string;
  countedBy: string | null;
  since: string | null;
  carriedMinor: number;
  cashSalesMinor: number;
  cashRefundsMinor: number;
  expectedMinor: number;
  countedMinor: number;
  /** counted − expected: negative is money missing, positive money over. */
  differenceMinor: number;
  note: string;
  banking: { id: string; amountMinor: number; reference: string; bankedAt: string; bankedBy: string | null } | null;
};

const MONEY_STATES = ['paid', 'partially_refunded', 'refunded'] as const;

function mayRead(ctx: Ctx) {
  if (!isStaff(ctx) && !hasRole(ctx, 'treasurer')) throw new ForbiddenError('Only stewards and the treasurer see the honour box.');
}

/** The box's expected contents at `at`, from the last count before it. */
export async function expectedInBox(db: Db, ctx: Pick<Ctx, 'spaceId'>, at: Date): Promise<BoxExpectation> {
  const { currency } = await spaceClock(db, ctx.spaceId);
  const last = await scoped(db, ctx)
    .selectFrom('honour_box_counts')
    .leftJoin('honour_box_bankings', 'honour_box_bankings.count_id', 'honour_box_counts.id')
    .select(['honour_box_counts.counted_at', 'honour_box_counts.counted_minor', 'honour_box_bankings.amount_minor'])
    .where('honour_box_counts.space_id', '=', ctx.spaceId)
    .where('honour_box_counts.counted_at', '<=', at)
    .orderBy('honour_box_counts.counted_at', 'desc')
    .limit(1)
    .executeTakeFirst();
  const since = last?.counted_at ?? null;
  const carriedMinor = last ? last.counted_minor - (last.amount_minor ?? 0) : 0;
  let sales = scoped(db, ctx)
    .selectFrom('sales')
    .select(sql<number>`coalesce(sum(total_minor), 0)::int`.as('sum'))
    .where('space_id', '=', ctx.spaceId)
    .where('method', '=', 'cash')
    .where('reverses_sale_id', 'is', null)
    .where('status', 'in', MONEY_STATES)
    .where('paid_at', '<=', at);
  let refunds = scoped(db, ctx)
    .selectFrom('refunds')
    .innerJoin('sales', 'sales.id', 'refunds.sale_id')
    .select(sql<number>`coalesce(sum(refunds.amount_minor), 0)::int`.as('sum'))
    .where('refunds.space_id', '=', ctx.spaceId)
    .where('sales.method', '=', 'cash')
    .where('refunds.created_at', '<=', at);
  if (since) {
    sales = sales.where('paid_at', '>', since);
    refunds = refunds.where('refunds.created_at', '>', since);
  }
  const cashSalesMinor = (await sales.executeTakeFirstOrThrow()).sum;
  const cashRefundsMinor = (await refunds.executeTakeFirstOrThrow()).sum;
  return {
    currency,
    since,
    carriedMinor,
    cashSalesMinor,
    cashRefundsMinor,
    expectedMinor: carriedMinor + cashSalesMinor - cashRefundsMinor,
  };
}

/** The box now (stewards and the treasurer): what it should hold, and its counts, newest first. */
export async function honourBox(db: Db, ctx: Ctx, opts: { from?: Date; to?: Date; limit?: number } = {}) {
  mayRead(ctx);
  return { expected: await expectedInBox(db, ctx, now()), counts: await boxCounts(db, ctx, opts) };
}

/** Counts (with their banking) in [from, to), newest first. */
export async function boxCounts(
  db: Db,
  ctx: Pick<Ctx, 'spaceId'>,
  opts: { from?: Date; to?: Date; limit?: number } = {},
): Promise<BoxCount[]> {
  let q = scoped(db, ctx)
    .selectFrom('honour_box_counts as c')
    .leftJoin('honour_box_bankings as b', 'b.count_id', 'c.id')
    .leftJoin('users as cu', 'cu.id', 'c.counted_by')
    .leftJoin('users as bu', 'bu.id', 'b.banked_by')
    .select([
      'c.id',
      'c.counted_at',
      'c.since',
      'c.carried_minor',
      'c.cash_sales_minor',
      'c.cash_refunds_minor',
      'c.expected_minor',
      'c.counted_minor',
      'c.note',
      'cu.name as counted_by',
      'b.id as banking_id',
      'b.amount_minor as banked_minor',
      'b.reference',
      'b.banked_at',
      'bu.name as banked_by',
    ])
    .where('c.space_id', '=', ctx.spaceId)
    .orderBy('c.counted_at', 'desc')
    .limit(opts.limit ?? 50);
  if (opts.from) q = q.where('c.counted_at', '>=', opts.from);
  if (opts.to) q = q.where('c.counted_at', '<', opts.to);
  const rows = await q.execute();
  return rows.map((r) => ({
    id: r.id,
    countedAt: r.counted_at.toISOString(),
    countedBy: r.counted_by,
    since: r.since?.toISOString() ?? null,
    carriedMinor: r.carried_minor,
    cashSalesMinor: r.cash_sales_minor,
    cashRefundsMinor: r.cash_refunds_minor,
    expectedMinor: r.expected_minor,
    countedMinor: r.counted_minor,
    differenceMinor: r.counted_minor - r.expected_minor,
    note: r.note,
    banking:
      r.banking_id && r.banked_at
        ? {
            id: r.banking_id,
            amountMinor: r.banked_minor ?? 0,
            reference: r.reference ?? '',
            bankedAt: r.banked_at.toISOString(),
            bankedBy: r.banked_by,
          }
        : null,
  }));
}

/** Counts, banks and the box's expectation change one at a time per space. */
const lockBox = (trx: Db, spaceId: string) =>
  sql`select pg_advisory_xact_lock(hashtext(${`honour-box:${spaceId}`}))`.execute(trx);

/** A steward counts the box: expected against counted, a difference explained in the note. */
export async function countBox(db: Db, ctx: Ctx, raw: BoxCountInput): Promise<BoxCount> {
  if (!isStaff(ctx)) throw new ForbiddenError('Only a steward counts the honour box.');
  const input = boxCountInput.parse(raw);
  const id = await db.transaction().execute(async (trx) => {
    await lockBox(trx, ctx.spaceId);
    const at = now();
    const e = await expectedInBox(trx, ctx, at);
    const difference = input.countedMinor - e.expectedMinor;
    if (difference !== 0 && !input.note)
      throw new InvalidError('Check note.', {
        note: [
          `The box should hold ${formatMoney(e.expectedMinor, e.currency)} and you counted ${formatMoney(input.countedMinor, e.currency)} (${difference > 0 ? 'over' : 'short'} by ${formatMoney(Math.abs(difference), e.currency)}): say what you think happened.`,
        ],
      });
    const row = await scoped(trx, ctx)
      .insertInto('honour_box_counts')
      .values({
        space_id: ctx.spaceId,
        currency: e.currency,
        counted_at: at,
        counted_by: ctx.userId,
        since: e.since,
        carried_minor: e.carriedMinor,
        cash_sales_minor: e.cashSalesMinor,
        cash_refunds_minor: e.cashRefundsMinor,
        expected_minor: e.expectedMinor,
        counted_minor: input.countedMinor,
        note: input.note,
      })
      .returning('id')
      .executeTakeFirstOrThrow();
    await audit(trx, {
      spaceId: ctx.spaceId,
      actorId: ctx.userId,
      action: 'honour_box.counted',
      targetType: 'honour_box_count',
      targetId: row.id,
      detail: { expectedMinor: e.expectedMinor, countedMinor: input.countedMinor, differenceMinor: difference, note: input.note },
    });
    return row.id;
  });
  return (await boxCounts(db, ctx, { limit: 1 })).find((c) => c.id === id)!;
}

/** A steward takes money counted in the box to the bank: the latest count only, once, at most what it found. */
export async function bankBox(db: Db, ctx: Ctx, raw: BoxBankingInput): Promise<BoxCount> {
  if (!isStaff(ctx)) throw new ForbiddenError('Only a steward banks the honour box.');
  const input = boxBankingInput.parse(raw);
  await db.transaction().execute(async (trx) => {
    await lockBox(trx, ctx.spaceId);
    const count = await scoped(trx, ctx)
      .selectFrom('honour_box_counts')
      .select(['id', 'counted_minor', 'currency', 'counted_at'])
      .where('space_id', '=', ctx.spaceId)
      .where('id', '=', input.countId)
      .executeTakeFirst();
    if (!count) throw new NotFoundError('No such count of the honour box.');
    const latest = await scoped(trx, ctx)
      .selectFrom('honour_box_counts')
      .select('id')
      .where('space_id', '=', ctx.spaceId)
      .orderBy('counted_at', 'desc')
      .limit(1)
      .executeTakeFirstOrThrow();
    if (latest.id !== count.id)
      throw new ConflictError('The box has been counted again since; bank from the latest count.', {
        countId: ['not the latest count'],
      });
    const banked = await scoped(trx, ctx)
      .selectFrom('honour_box_bankings')
      .leftJoin('users', 'users.id', 'honour_box_bankings.banked_by')
      .select(['users.name', 'honour_box_bankings.amount_minor'])
      .where('honour_box_bankings.space_id', '=', ctx.spaceId)
      .where('honour_box_bankings.count_id', '=', count.id)
      .executeTakeFirst();
    if (banked)
      throw new ConflictError(
        `This count was already banked (${formatMoney(banked.amount_minor, count.currency.trim())}${banked.name ? ` by ${banked.name}` : ''}).`,
      );
    if (input.amountMinor > count.counted_minor)
      throw new InvalidError('Check amountMinor.', {
        amountMinor: [`The count found ${formatMoney(count.counted_minor, count.currency.trim())}; you cannot bank more than that.`],
      });
    const at = now();
    const row = await scoped(trx, ctx)
      .insertInto('honour_box_bankings')
      .values({
        space_id: ctx.spaceId,
        count_id: count.id,
        amount_minor: input.amountMinor,
        reference: input.reference,
        banked_at: at,
        banked_by: ctx.userId,
      })
      .returning('id')
      .executeTakeFirstOrThrow();
    await audit(trx, {
      spaceId: ctx.spaceId,
      actorId: ctx.userId,
      action: 'honour_box.banked',
      targetType: 'honour_box_count',
      targetId: count.id,
      detail: { bankingId: row.id, amountMinor: input.amountMinor, reference: input.reference },
    });
  });
  return (await boxCounts(db, ctx, { limit: 5 })).find((c) => c.id === input.countId)!;
}
