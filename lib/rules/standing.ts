import 'server-only';
import { builtOnce } from '@/db/built-once';
import { scoped } from '@/db/scoped';
import { sql } from 'kysely';
import type { Db } from '@/db/connect';
import type { BorrowingRules } from './schema';
import { formatDateTime } from '@/lib/format';
import { formatMoney } from '@/lib/money';
import { owedBy } from '@/lib/charges/owed';
import { spaceClock } from '@/lib/sales/periods';

// A member's standing: whether the space's rules let them start a new loan now. Read inside the borrow's
// transaction (under the borrower's lock), so the answer is the one the loan is written against.

export type StandingRefusal = { message: string; fields: Record<string, string[]> };

/** Why this person may not borrow now, or null. `self`: the person asking is the borrower. */
export async function standingRefusal(
  db: Db,
  spaceId: string,
  borrowerId: string,
  rules: BorrowingRules,
  at: Date,
  opts: { self: boolean; timeZone: string },
): Promise<StandingRefusal | null> {
  return (await overdueRefusal(db, spaceId, borrowerId, rules, at, opts)) ?? (await owingRefusal(db, spaceId, borrowerId, rules, opts));
}

/** The "owes more than" rule: what the member owes in charges, against the space's limit. */
async function owingRefusal(
  db: Db,
  spaceId: string,
  borrowerId: string,
  rules: BorrowingRules,
  opts: { self: boolean },
): Promise<StandingRefusal | null> {
  const limit = rules.refuseWhenOwingOverMinor;
  if (limit === null) return null;
  const owed = await owedBy(db, spaceId, borrowerId);
  if (owed <= limit) return null;
  const { currency } = await spaceClock(db, spaceId);
  const money = (n: number) => formatMoney(n, currency);
  return {
    message:
      `${opts.self ? 'You owe' : 'This member owes'} ${money(owed)} in charges, more than this space allows (${money(limit)}). ` +
      `No new loan until what is owed is ${money(limit)} or less: settling it with a steward clears it.`,
    fields: { borrowerId: [`owes ${money(owed)}, over the limit of ${money(limit)}`] },
  };
}

/** The borrower's loans past due at `at`, with what each holds. Built once per process (every borrow reads it). */
const overdueLoans = builtOnce('overdue_loans', (db, spaceId: string, borrowerId: string, at: Date) =>
  scoped(db, { spaceId })
    .selectFrom('loans')
    .leftJoin('kit_boxes', 'kit_boxes.id', 'loans.kit_box_id')
    .select([
      'loans.id',
      'loans.due_at',
      'kit_boxes.name as box',
      sql<string | null>`(select string_agg(p.name, ', ' order by p.name) from loan_lines ll
        join parts p on p.space_id = ll.space_id and p.id = ll.part_id
        where ll.space_id = loans.space_id and ll.loan_id = loans.id)`.as('parts'),
    ])
    .where('loans.space_id', '=', spaceId)
    .where('loans.borrower_id', '=', borrowerId)
    .where('loans.status', '=', 'out')
    .where('loans.due_at', '<', at)
    .orderBy('loans.due_at'),
);

async function overdueRefusal(
  ...[db, spaceId, borrowerId, rules, at, opts]: Parameters<typeof standingRefusal>
): Promise<StandingRefusal | null> {
  if (!rules.refuseWhileOverdue) return null;
  const late = await overdueLoans(db, spaceId, borrowerId, at);
  if (!late.length) return null;
  const items = late.map((l) => `${l.box ?? l.parts ?? 'a loan'} (due ${formatDateTime(l.due_at, opts.timeZone)})`);
  const subject = opts.self ? 'You have' : 'This member has';
  const them = opts.self ? 'you' : 'they';
  const count = late.length === 1 ? 'a loan' : `${late.length} loans`;
  return {
    message:
      `${subject} ${count} past the due date: ${items.join('; ')}. ` +
      `No new loan until ${late.length === 1 ? 'it is' : 'they are'} back, or a steward renews ${late.length === 1 ? 'it' : 'them'}; then ${them} can borrow again.`,
    fields: { borrowerId: [`${late.length} overdue ${late.length === 1 ? 'loan' : 'loans'}`] },
  };
}
