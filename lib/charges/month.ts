import 'server-only';
import type { Db } from '@/db/connect';
import { scoped } from '@/db/scoped';

// The treasurer's month of charges and deposits (the Books page's tile and the filing CSV's own
// sections): charges raised (by kind), paid by card and in cash, and deposits held, given back and kept
// for charges. Each row is dated by when its money moved: a charge when written, a payment when paid, a
// deposit when paid (held), when its refund was booked (given back), and when its split was fixed (kept).
// Integer minor units of the space's currency (ISO 4217).

export type ChargeMonthRow = {
  section: 'charge raised' | 'charge paid' | 'deposit held' | 'deposit given back' | 'deposit kept';
  at: Date;
  person: string | null;
  item: string;
  method: 'card' | 'cash' | '';
  amountMinor: number;
  note: string;
  ref: string;
};

export type ChargeMonth = {
  rows: ChargeMonthRow[];
  raisedMinor: number;
  raisedByKind: { missing: number; damaged: number; late: number };
  paidByCardMinor: number;
  paidInCashMinor: number;
  depositsHeldMinor: number;
  depositsGivenBackMinor: number;
  depositsKeptMinor: number;
  /** Deposits whose refund the processor has not taken yet (release pending), now. */
  releasePending: number;
};

const sum = (rows: ChargeMonthRow[], section: ChargeMonthRow['section'], method?: 'card' | 'cash') =>
  rows.filter((r) => r.section === section && (!method || r.method === method)).reduce((s, r) => s + r.amountMinor, 0);

export async function chargesOfMonth(db: Db, spaceId: string, range: { from: Date; to: Date }): Promise<ChargeMonth> {
  const { from, to } = range;
  const s = { spaceId };
  const charges = await scoped(db, s)
    .selectFrom('charges')
    .leftJoin('users', 'users.id', 'charges.user_id')
    .select(['charges.id', 'charges.created_at', 'users.name', 'charges.item', 'charges.kind', 'charges.amount_minor', 'charges.from_deposit_minor', 'charges.note'])
    .where('charges.created_at', '>=', from)
    .where('charges.created_at', '<', to)
    .execute();
  const payments = await scoped(db, s)
    .selectFrom('charge_payments')
    .leftJoin('users', 'users.id', 'charge_payments.user_id')
    .select(['charge_payments.id', 'charge_payments.paid_at', 'users.name', 'charge_payments.method', 'charge_payments.amount_minor', 'charge_payments.payment_intent_id'])
    .where('charge_payments.status', '=', 'paid')
    .where('charge_payments.paid_at', '>=', from)
    .where('charge_payments.paid_at', '<', to)
    .execute();
  const deposits = await scoped(db, s)
    .selectFrom('deposits')
    .innerJoin('loans', 'loans.id', 'deposits.loan_id')
    .leftJoin('users', 'users.id', 'loans.borrower_id')
    .leftJoin('kit_boxes', 'kit_boxes.id', 'loans.kit_box_id')
    .select([
      'deposits.id',
      'users.name',
      'kit_boxes.name as box',
      'deposits.amount_minor',
      'deposits.paid_at',
      'deposits.payment_intent_id',
      'deposits.kept_minor',
      'deposits.released_minor',
      'deposits.refund_id',
      'deposits.released_at',
      'deposits.release_started_at',
    ])
    .where((eb) =>
      eb.or([
        eb.and([eb('deposits.paid_at', '>=', from), eb('deposits.paid_at', '<', to)]),
        eb.and([eb('deposits.released_at', '>=', from), eb('deposits.released_at', '<', to)]),
        eb.and([eb('deposits.release_started_at', '>=', from), eb('deposits.release_started_at', '<', to)]),
      ]),
    )
    .execute();
  const pending = await scoped(db, s)
    .selectFrom('deposits')
    .select((eb) => eb.fn.countAll<string>().as('n'))
    .where('status', '=', 'releasing')
    .executeTakeFirstOrThrow();

  const inMonth = (d: Date | null): d is Date => d !== null && d >= from && d < to;
  const rows: ChargeMonthRow[] = [];
  for (const c of charges)
    rows.push({
      section: 'charge raised',
      at: c.created_at,
      person: c.name,
      item: c.item,
      method: '',
      amountMinor: c.amount_minor,
      note: [c.kind, c.from_deposit_minor ? `${c.from_deposit_minor} kept from the deposit` : '', c.note].filter(Boolean).join('; '),
      ref: c.id,
    });
  for (const p of payments)
    rows.push({
      section: 'charge paid',
      at: p.paid_at!,
      person: p.name,
      item: 'towards charges',
      method: p.method,
      amountMinor: p.amount_minor,
      note: '',
      ref: p.payment_intent_id ?? p.id,
    });
  for (const d of deposits) {
    const item = `deposit for ${d.box ?? 'a kit'}`;
    if (inMonth(d.paid_at))
      rows.push({ section: 'deposit held', at: d.paid_at, person: d.name, item, method: 'card', amountMinor: d.amount_minor, note: '', ref: d.payment_intent_id ?? d.id });
    if (inMonth(d.release_started_at) && d.kept_minor > 0)
      rows.push({ section: 'deposit kept', at: d.release_started_at, person: d.name, item, method: '', amountMinor: d.kept_minor, note: 'kept for charges', ref: d.id });
    if (inMonth(d.released_at) && d.refund_id && d.released_minor)
      rows.push({ section: 'deposit given back', at: d.released_at, person: d.name, item, method: 'card', amountMinor: d.released_minor, note: '', ref: d.refund_id });
  }
  rows.sort((a, b) => a.at.getTime() - b.at.getTime() || a.section.localeCompare(b.section));
  const kind = (k: string) => charges.filter((c) => c.kind === k).reduce((x, c) => x + c.amount_minor, 0);
  return {
    rows,
    raisedMinor: sum(rows, 'charge raised'),
    raisedByKind: { missing: kind('missing'), damaged: kind('damaged'), late: kind('late') },
    paidByCardMinor: sum(rows, 'charge paid', 'card'),
    paidInCashMinor: sum(rows, 'charge paid', 'cash'),
    depositsHeldMinor: sum(rows, 'deposit held'),
    depositsGivenBackMinor: sum(rows, 'deposit given back'),
    depositsKeptMinor: sum(rows, 'deposit kept'),
    releasePending: Number(pending.n),
  };
}
