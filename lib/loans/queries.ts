import 'server-only';
import { loanMoney, type LoanMoney } from '@/lib/deposits/read';
import { sql } from 'kysely';
import type { Db } from '@/db/connect';
import { scoped } from '@/db/scoped';
import type { LoanStatus } from '@/db/types';
import { isStaff, type Ctx } from '@/lib/auth/roles';
import { now } from '@/lib/clock';
import { ForbiddenError, NotFoundError } from '@/lib/errors';
import { keySpec } from '@/lib/inventory/specs';
import { readStoredReport, type StoredReport } from './check';
import { daysLate } from './due';
import { loanSettings } from './settings';

// Read side of loans: lists, one loan, the overdue round, holds, the weekly chart, the audit trail.

export type LoanFilter = 'out' | 'overdue' | 'returned' | 'all';

export type LoanRow = {
  id: string;
  title: string;
  borrowerName: string;
  borrowerId: string;
  status: LoanStatus;
  overdue: boolean;
  dueAt: Date;
  outAt: Date;
  returnedAt: Date | null;
  verdict: 'ok' | 'caution' | 'fail' | null;
  overridden: boolean;
};

const titleExpr = sql<string>`coalesce(kit_boxes.name, (select string_agg(case when ll.qty > 1 then ll.qty || ' × ' || p.name else p.name end, ', ' order by p.name)
  from loan_lines ll join parts p on p.space_id = ll.space_id and p.id = ll.part_id
  where ll.space_id = loans.space_id and ll.loan_id = loans.id), 'Loan')`;

/** Loans of the space with their borrower and box, and `title` (the box, or the parts) to select. */
const loansWithBorrower = (db: Db, spaceId: string) =>
  scoped(db, { spaceId })
    .selectFrom('loans')
    .innerJoin('users', 'users.id', 'loans.borrower_id')
    .leftJoin('kit_boxes', 'kit_boxes.id', 'loans.kit_box_id')
    .where('loans.space_id', '=', spaceId);

/** Members see their own loans; stewards and admins see everyone's (or their own with `mine`). */
export async function listLoans(
  db: Db,
  ctx: Ctx,
  filter: LoanFilter,
  opts: { mine?: boolean; limit?: number } = {},
): Promise<LoanRow[]> {
  const at = now();
  let q = loansWithBorrower(db, ctx.spaceId).select([
    'loans.id',
    titleExpr.as('title'),
    'users.name as borrowerName',
    'loans.borrower_id as borrowerId',
    'loans.status',
    'loans.due_at as dueAt',
    'loans.out_at as outAt',
    'loans.returned_at as returnedAt',
    'loans.check_verdict as verdict',
    'loans.override_reason',
  ]);
  if (!isStaff(ctx) || opts.mine) q = q.where('loans.borrower_id', '=', ctx.userId);
  // "Out" includes what waits at the bench for a hand-over and what is back but not yet checked
  // (bench hand-over): both still need someone to act.
  if (filter === 'out') q = q.where('loans.status', 'in', ['waiting', 'out', 'back_unchecked']).orderBy('loans.due_at');
  else if (filter === 'overdue')
    q = q.where('loans.status', '=', 'out').where('loans.due_at', '<', at).orderBy('loans.due_at');
  else if (filter === 'returned')
    q = q.where('loans.status', 'in', ['returned', 'returned_short']).orderBy('loans.returned_at', 'desc');
  else q = q.orderBy('loans.out_at', 'desc');
  const rows = await q.limit(opts.limit ?? 200).execute();
  return rows.map(({ override_reason, ...r }) => ({
    ...r,
    overdue: r.status === 'out' && r.dueAt < at,
    overridden: override_reason !== null,
  }));
}

export type LoanDetail = {
  id: string;
  title: string;
  status: LoanStatus;
  overdue: boolean;
  daysLate: number;
  borrower: { id: string; name: string; email: string };
  lentBy: string | null;
  kitBox: { id: string; name: string; code: string } | null;
  outAt: Date;
  dueAt: Date;
  returnedAt: Date | null;
  renewals: number;
  maxRenewals: number;
  verdict: 'ok' | 'caution' | 'fail' | null;
  cautionAcknowledged: boolean;
  override: { reason: string; by: string | null } | null;
  report: StoredReport | null;
  timeZone: string;
  lines: {
    id: string;
    partId: string;
    name: string;
    qty: number;
    unitCode: string | null;
    locationName: string | null;
    chainRole: string | null;
    returnedQty: number;
    condition: 'ok' | 'missing' | 'damaged' | null;
  }[];
  waitingHolds: number;
  reminders: { kind: string; forDay: string; status: string; sentAt: Date | null }[];
  isMine: boolean;
} & LoanMoney;

export async function getLoan(db: Db, ctx: Ctx, loanId: string): Promise<LoanDetail> {
  const l = await scoped(db, ctx)
    .selectFrom('loans')
    .innerJoin('users as b', 'b.id', 'loans.borrower_id')
    .leftJoin('users as lender', 'lender.id', 'loans.lent_by_id')
    .leftJoin('users as ov', 'ov.id', 'loans.override_by')
    .leftJoin('kit_boxes', 'kit_boxes.id', 'loans.kit_box_id')
    .select([
      'loans.id',
      titleExpr.as('title'),
      'loans.status',
      'loans.borrower_id',
      'b.name as borrowerName',
      'b.email as borrowerEmail',
      'lender.name as lentBy',
      'kit_boxes.id as boxId',
      'kit_boxes.name as boxName',
      'kit_boxes.code as boxCode',
      'loans.out_at',
      'loans.due_at',
      'loans.returned_at',
      'loans.renewals',
      'loans.check_verdict',
      'loans.check_report',
      'loans.caution_acknowledged',
      'loans.override_reason',
      'ov.name as overrideBy',
    ])
    .where('loans.id', '=', loanId)
    .where('loans.space_id', '=', ctx.spaceId)
    .executeTakeFirst();
  if (!l || (l.borrower_id !== ctx.userId && !isStaff(ctx))) throw new NotFoundError('No such loan.');
  const settings = await loanSettings(db, ctx.spaceId);
  const lines = await scoped(db, ctx)
    .selectFrom('loan_lines')
    .innerJoin('parts', 'parts.id', 'loan_lines.part_id')
    .leftJoin('units', 'units.id', 'loan_lines.unit_id')
    .leftJoin('locations', 'locations.id', 'loan_lines.location_id')
    .select([
      'loan_lines.id',
      'loan_lines.part_id as partId',
      'parts.name',
      'loan_lines.qty',
      'units.code as unitCode',
      'locations.name as locationName',
      'loan_lines.chain_role as chainRole',
      'loan_lines.returned_qty as returnedQty',
      'loan_lines.return_condition as condition',
    ])
    .where('loan_lines.loan_id', '=', l.id)
    .orderBy(
      sql`case loan_lines.chain_role when 'supply' then 0 when 'driver' then 1 when 'led' then 2 when 'wire' then 3 else 4 end`,
    )
    .orderBy('parts.name')
    .execute();
  const holds = await scoped(db, ctx)
    .selectFrom('holds')
    .select((eb) => eb.fn.countAll<number>().as('n'))
    .where('space_id', '=', ctx.spaceId)
    .where('status', 'in', ['waiting', 'ready'])
    .where((eb) =>
      eb.or([
        ...(l.boxId ? [eb('kit_box_id', '=', l.boxId)] : []),
        eb(
          'unit_id',
          'in',
          eb
            .selectFrom('loan_lines')
            .select('unit_id')
            .where('loan_id', '=', l.id)
            .where('unit_id', 'is not', null),
        ),
      ]),
    )
    .executeTakeFirstOrThrow();
  const reminders = await scoped(db, ctx)
    .selectFrom('reminders')
    .select(['kind', 'for_day as forDay', 'status', 'sent_at as sentAt'])
    .where('loan_id', '=', l.id)
    .orderBy('created_at', 'desc')
    .limit(20)
    .execute();
  const at = now();
  const overdue = l.status === 'out' && l.due_at < at;
  return {
    id: l.id,
    title: l.title,
    status: l.status,
    overdue,
    daysLate: l.status === 'out' ? daysLate(l.due_at, at, settings.timeZone) : 0,
    borrower: { id: l.borrower_id, name: l.borrowerName, email: l.borrowerEmail },
    lentBy: l.lentBy,
    kitBox: l.boxId ? { id: l.boxId, name: l.boxName!, code: l.boxCode! } : null,
    outAt: l.out_at,
    dueAt: l.due_at,
    returnedAt: l.returned_at,
    renewals: l.renewals,
    maxRenewals: settings.maxRenewals,
    verdict: l.check_verdict,
    cautionAcknowledged: l.caution_acknowledged,
    override: l.override_reason ? { reason: l.override_reason, by: l.overrideBy } : null,
    report: readStoredReport(l.check_report),
    timeZone: settings.timeZone,
    lines,
    waitingHolds: holds.n,
    reminders,
    isMine: l.borrower_id === ctx.userId,
    ...(await loanMoney(db, ctx.spaceId, l.id)),
  };
}

export type RoundRow = {
  id: string;
  title: string;
  daysLate: number;
  dueAt: Date;
  borrower: { name: string; email: string };
  lines: string[];
  lastReminder: Date | null;
  reminders: number;
};

/** The steward's round: loans past due, the latest first to be chased, most days late at the top. */
export async function overdueRound(db: Db, ctx: Ctx): Promise<{ rows: RoundRow[]; timeZone: string }> {
  if (!isStaff(ctx)) throw new ForbiddenError();
  const at = now();
  const { timeZone } = await loanSettings(db, ctx.spaceId);
  const rows = await loansWithBorrower(db, ctx.spaceId)
    .select([
      'loans.id',
      titleExpr.as('title'),
      'loans.due_at',
      'users.name',
      'users.email',
      sql<
        string[]
      >`(select coalesce(array_agg(case when ll.qty > 1 then ll.qty || ' × ' || p.name else p.name end || coalesce(' (' || u.code || ')', '') order by p.name), '{}')
        from loan_lines ll join parts p on p.space_id = ll.space_id and p.id = ll.part_id
        left join units u on u.space_id = ll.space_id and u.id = ll.unit_id
        where ll.space_id = loans.space_id and ll.loan_id = loans.id)`.as(
        'lines',
      ),
      sql<Date | null>`(select max(r.sent_at) from reminders r where r.space_id = loans.space_id and r.loan_id = loans.id and r.status = 'sent')`.as(
        'lastReminder',
      ),
      sql<number>`(select count(*)::int from reminders r where r.space_id = loans.space_id and r.loan_id = loans.id and r.status = 'sent')`.as(
        'reminders',
      ),
    ])
    .where('loans.status', '=', 'out')
    .where('loans.due_at', '<', at)
    .orderBy('loans.due_at')
    .limit(500)
    .execute();
  return {
    timeZone,
    rows: rows.map((r) => ({
      id: r.id,
      title: r.title,
      daysLate: daysLate(r.due_at, at, timeZone),
      dueAt: r.due_at,
      borrower: { name: r.name, email: r.email },
      lines: r.lines,
      lastReminder: r.lastReminder,
      reminders: r.reminders,
    })),
  };
}

export type WeekPoint = { week: string; out: number; overdue: number };

/** Loans out and overdue at the end of each of the last 12 weeks (the last point is now). */
export async function loansPerWeek(db: Db, ctx: Ctx, weeks = 12): Promise<WeekPoint[]> {
  if (!isStaff(ctx)) throw new ForbiddenError();
  const at = now();
  const { timeZone } = await loanSettings(db, ctx.spaceId);
  const rows = await db
    .selectFrom(
      sql<{
        t: Date;
      }>`(select ${at}::timestamptz - (n * interval '7 days') as t from generate_series(0, ${weeks - 1}) n)`.as(
        'w',
      ),
    )
    .select([
      'w.t',
      sql<number>`(select count(*)::int from loans l where l.space_id = ${ctx.spaceId} and l.out_at <= w.t and (l.returned_at is null or l.returned_at > w.t))`.as(
        'out',
      ),
      sql<number>`(select count(*)::int from loans l where l.space_id = ${ctx.spaceId} and l.out_at <= w.t and (l.returned_at is null or l.returned_at > w.t) and l.due_at < w.t)`.as(
        'overdue',
      ),
    ])
    .orderBy('w.t')
    .execute();
  const label = new Intl.DateTimeFormat('en-GB', { day: 'numeric', month: 'short', timeZone });
  return rows.map((r) => ({ week: label.format(new Date(r.t)), out: r.out, overdue: r.overdue }));
}

export type HoldRow = {
  id: string;
  status: 'waiting' | 'ready';
  itemName: string;
  kitBoxId: string | null;
  unitId: string | null;
  createdAt: Date;
  userName: string;
  position: number;
};

/** My open holds (a member), or all open holds in the space (staff, `all`). */
export async function listHolds(db: Db, ctx: Ctx, opts: { all?: boolean } = {}): Promise<HoldRow[]> {
  let q = scoped(db, ctx)
    .selectFrom('holds')
    .innerJoin('users', 'users.id', 'holds.user_id')
    .leftJoin('kit_boxes', 'kit_boxes.id', 'holds.kit_box_id')
    .leftJoin('units', 'units.id', 'holds.unit_id')
    .leftJoin('parts', 'parts.id', 'units.part_id')
    .select([
      'holds.id',
      'holds.status',
      sql<string>`coalesce(kit_boxes.name, parts.name || ' (' || units.code || ')')`.as('itemName'),
      'holds.kit_box_id as kitBoxId',
      'holds.unit_id as unitId',
      'holds.created_at as createdAt',
      'users.name as userName',
      sql<number>`(select count(*)::int from holds h2 where h2.space_id = holds.space_id and h2.status in ('waiting','ready')
        and coalesce(h2.kit_box_id, h2.unit_id) = coalesce(holds.kit_box_id, holds.unit_id) and (h2.created_at, h2.id) <= (holds.created_at, holds.id))`.as(
        'position',
      ),
    ])
    .where('holds.space_id', '=', ctx.spaceId)
    .where('holds.status', 'in', ['waiting', 'ready']);
  if (!(opts.all && isStaff(ctx))) q = q.where('holds.user_id', '=', ctx.userId);
  const rows = await q.orderBy('holds.created_at').execute();
  return rows as HoldRow[];
}

export type AuditRow = {
  id: string;
  at: Date;
  action: string;
  actor: string | null;
  targetType: string | null;
  targetId: string | null;
  detail: Record<string, unknown>;
  /** What the line is about (the box, or the loan's parts; the held item; the kit), read now. */
  thing?: string | null;
  /** Whom it concerns (the borrower, the holder), beside the actor who did it. */
  person?: string | null;
};

export const LOAN_AUDIT_PREFIXES = ['loan.', 'hold.', 'reminder.', 'kit_box.', 'kit_template.'];

/** The loans trail for stewards: loans, returns, overrides, holds, renewals, reminders, kit changes. */
export async function loanAudit(
  db: Db,
  ctx: Ctx,
  opts: { action?: string; before?: string; limit?: number } = {},
): Promise<AuditRow[]> {
  if (!isStaff(ctx)) throw new ForbiddenError();
  let q = scoped(db, ctx)
    .selectFrom('audit_log')
    .leftJoin('users', 'users.id', 'audit_log.actor_id')
    .select([
      'audit_log.id',
      'audit_log.created_at as at',
      'audit_log.action',
      'users.name as actor',
      'audit_log.target_type as targetType',
      'audit_log.target_id as targetId',
      'audit_log.detail',
    ])
    .where('audit_log.space_id', '=', ctx.spaceId)
    .where((eb) => eb.or(LOAN_AUDIT_PREFIXES.map((p) => eb('audit_log.action', 'like', `${p}%`))));
  if (opts.action) q = q.where('audit_log.action', '=', opts.action);
  if (opts.before) q = q.where(sql<boolean>`audit_log.id < ${Number(opts.before)}`);
  const rows = await q
    .orderBy('audit_log.id', 'desc')
    .limit(opts.limit ?? 100)
    .execute();
  const named = await auditTargets(db, ctx.spaceId, rows);
  return rows.map((r) => ({ ...r, id: String(r.id), ...(named.get(`${r.targetType}:${r.targetId}`) ?? {}) }));
}

const UUID_RE = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/** Names the thing and the person of each audit row's target, a few queries for the whole page. */
async function auditTargets(
  db: Db,
  spaceId: string,
  rows: { targetType: string | null; targetId: string | null }[],
): Promise<Map<string, { thing: string | null; person: string | null }>> {
  const ids = (type: string) => [
    ...new Set(rows.filter((r) => r.targetType === type && r.targetId && UUID_RE.test(r.targetId)).map((r) => r.targetId!)),
  ];
  const out = new Map<string, { thing: string | null; person: string | null }>();
  const loanIds = ids('loan');
  if (loanIds.length) {
    const loans = await scoped(db, { spaceId })
      .selectFrom('loans')
      .innerJoin('users', 'users.id', 'loans.borrower_id')
      .leftJoin('kit_boxes', 'kit_boxes.id', 'loans.kit_box_id')
      .select(['loans.id', 'users.name as person', 'kit_boxes.name as box'])
      .select((eb) =>
        eb
          .selectFrom('loan_lines')
          .innerJoin('parts', 'parts.id', 'loan_lines.part_id')
          .select(sql<string>`string_agg(case when loan_lines.qty > 1 then loan_lines.qty || ' × ' else '' end || parts.name, ', ' order by parts.name)`.as('n'))
          .whereRef('loan_lines.loan_id', '=', 'loans.id')
          .as('items'),
      )
      .where('loans.space_id', '=', spaceId)
      .where('loans.id', 'in', loanIds)
      .execute();
    for (const l of loans) out.set(`loan:${l.id}`, { thing: l.box ?? l.items, person: l.person });
  }
  const holdIds = ids('hold');
  if (holdIds.length) {
    const holds = await scoped(db, { spaceId })
      .selectFrom('holds')
      .innerJoin('users', 'users.id', 'holds.user_id')
      .leftJoin('kit_boxes', 'kit_boxes.id', 'holds.kit_box_id')
      .leftJoin('units', 'units.id', 'holds.unit_id')
      .leftJoin('parts', 'parts.id', 'units.part_id')
      .select(['holds.id', 'users.name as person', 'kit_boxes.name as box', 'parts.name as part'])
      .where('holds.space_id', '=', spaceId)
      .where('holds.id', 'in', holdIds)
      .execute();
    for (const h of holds) out.set(`hold:${h.id}`, { thing: h.box ?? h.part, person: h.person });
  }
  const boxIds = ids('kit_box');
  if (boxIds.length) {
    const boxes = await scoped(db, { spaceId })
      .selectFrom('kit_boxes')
      .select(['id', 'name'])
      .where('space_id', '=', spaceId)
      .where('id', 'in', boxIds)
      .execute();
    for (const b of boxes) out.set(`kit_box:${b.id}`, { thing: b.name, person: null });
  }
  return out;
}

/** People of the space a steward can lend to at the bench. */
export async function spaceMembers(db: Db, ctx: Ctx): Promise<{ id: string; name: string; email: string }[]> {
  if (!isStaff(ctx)) throw new ForbiddenError();
  return scoped(db, ctx)
    .selectFrom('memberships')
    .innerJoin('users', 'users.id', 'memberships.user_id')
    .select(['users.id', 'users.name', 'users.email'])
    .where('memberships.space_id', '=', ctx.spaceId)
    .where('users.disabled_at', 'is', null)
    // Access switched off in this space: no longer someone to lend or sell to here.
    .where('memberships.disabled_at', 'is', null)
    .orderBy('users.name')
    .execute();
}

export type LoosePick = {
  units: { id: string; code: string; name: string; category: string; keySpec: string }[];
  counted: {
    partId: string;
    name: string;
    category: string;
    keySpec: string;
    bins: { locationId: string; name: string; qty: number }[];
  }[];
};

/** What can be borrowed loose: free labelled units not in a box, and counted lendable stock per bin. */
export async function loosePick(db: Db, ctx: Ctx): Promise<LoosePick> {
  const units = await scoped(db, ctx)
    .selectFrom('units')
    .innerJoin('parts', 'parts.id', 'units.part_id')
    .select(['units.id', 'units.code', 'parts.name', 'parts.category', 'parts.specs'])
    .where('units.space_id', '=', ctx.spaceId)
    .where('units.state', '=', 'on_shelf')
    .where('units.kit_box_id', 'is', null)
    .where('parts.lendable', '=', true)
    .where('parts.archived_at', 'is', null)
    .orderBy('parts.name')
    .orderBy('units.code')
    .execute();
  const stock = await scoped(db, ctx)
    .selectFrom('stock')
    .innerJoin('parts', 'parts.id', 'stock.part_id')
    .innerJoin('locations', 'locations.id', 'stock.location_id')
    .select([
      'parts.id as partId',
      'parts.name',
      'parts.category',
      'parts.specs',
      'locations.id as locationId',
      'locations.name as locationName',
      'stock.qty',
    ])
    .where('stock.space_id', '=', ctx.spaceId)
    .where('stock.qty', '>', 0)
    .where('parts.lendable', '=', true)
    .where('parts.archived_at', 'is', null)
    .orderBy('parts.name')
    .execute();
  const counted = new Map<string, LoosePick['counted'][number]>();
  for (const s of stock) {
    const entry = counted.get(s.partId) ?? {
      partId: s.partId,
      name: s.name,
      category: s.category,
      keySpec: keySpec(s.category, s.specs),
      bins: [],
    };
    entry.bins.push({ locationId: s.locationId, name: s.locationName, qty: s.qty });
    counted.set(s.partId, entry);
  }
  return {
    units: units.map(({ specs, ...u }) => ({ ...u, keySpec: keySpec(u.category, specs) })),
    counted: [...counted.values()],
  };
}
