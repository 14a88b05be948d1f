import 'server-only';
import { sql } from 'kysely';
import type { Db } from '@/db/connect';
import { builtOnce } from '@/db/built-once';
import { scoped } from '@/db/scoped';
import { audit, auditRow } from '@/lib/audit/log';
import { isStaff, type Ctx } from '@/lib/auth/roles';
import { now } from '@/lib/clock';
import { ConflictError, ForbiddenError, NotFoundError } from '@/lib/errors';
import { buildNote, looseOutcome, refusalReasons } from './build';
import { checkLines, storedReport } from './check';
import { inductionRefusal, missingInductions, stewardsToAsk } from '@/lib/inductions/gate';
import { standingRefusal } from '@/lib/rules/standing';
import { computeDueAt } from './due';
import { categoryDeposit, recordDeposit, templateDeposit, type DepositDue } from '@/lib/deposits/take';
import { limitReached, openLoanCount } from './lock';
import { gateFor } from './preview';
import type { BorrowInput } from './schemas';
import { boxLines, chainRoleOf, loadBox, looseLines, type SelectionLine } from './selection';
import { LOAN_SETTING_COLUMNS, toLoanSettings } from './settings';

// Borrowing, in one transaction: lock what is taken, check the exact parts again on the server, apply
// the gate (fail → steward override with a reason; caution → the borrower's acknowledgement), the
// open-loan limit, then write the loan, its lines, the stock movements and the audit rows.

export type BorrowResult = {
  id: string;
  /** 'waiting' (at the bench, for a steward to hand over) or 'out'. */
  status: 'waiting' | 'out';
  dueAt: Date;
  verdict: 'ok' | 'caution' | 'fail' | null;
  overridden: boolean;
  /** Inductions the borrower lacked, lent anyway on a steward's override with a reason. */
  inductionsOverridden: string[];
  /** What was checked as the borrower's whole build, or what it still lacks; null when not a build. */
  note: string | null;
  /** The deposit to pay before this becomes a loan (the kit asks for one), or null. */
  deposit: DepositDue | null;
};

/** A box or unit may be taken when it is on the shelf, or held ready for this borrower. */
const takeable = (table: 'kit_boxes' | 'units', borrowerId: string) =>
  sql<boolean>`(${sql.ref(`${table}.state`)} = 'on_shelf' or (${sql.ref(`${table}.state`)} = 'held' and exists (
    select 1 from holds h where h.space_id = ${sql.ref(`${table}.space_id`)} and h.status = 'ready' and h.user_id = ${borrowerId}
      and ${table === 'kit_boxes' ? sql`h.kit_box_id` : sql`h.unit_id`} = ${sql.ref(`${table}.id`)})))`;

/** The borrower's membership row, locked, with the space's lending rules. Built once per process. */
const borrowerLock = builtOnce('borrower_lock', (db, spaceId: string, borrowerId: string) =>
  scoped(db, { spaceId })
    .selectFrom('memberships')
    .innerJoin('spaces', 'spaces.id', 'memberships.space_id')
    .select(['memberships.user_id', ...LOAN_SETTING_COLUMNS])
    .where('memberships.space_id', '=', spaceId)
    .where('memberships.user_id', '=', borrowerId)
    .forUpdate('memberships'),
);

/** Counted stock leaving its bin, guarded: no row back means the bin holds less than asked. Built once. */
const takeCounted = builtOnce('stock_take', (db, spaceId: string, partId: string, locationId: string, qty: number, at: Date) =>
  scoped(db, { spaceId })
    .updateTable('stock')
    .set((eb) => ({ qty: eb('qty', '-', qty), updated_at: at }))
    .where('part_id', '=', partId)
    .where('location_id', '=', locationId)
    .where('qty', '>=', qty)
    .returning('qty'),
);

export async function borrow(db: Db, ctx: Ctx, input: BorrowInput): Promise<BorrowResult> {
  const staff = isStaff(ctx);
  const borrowerId = input.borrowerId ?? ctx.userId;
  if (borrowerId !== ctx.userId && !staff)
    throw new ForbiddenError("Only a steward can lend on someone else's behalf.");
  if ((input.overrides.check || input.overrides.inductions) && !staff)
    throw new ForbiddenError('Only a steward or an admin can override the check or the induction rule.');
  const sel = input.selection;

  return db.transaction().execute(async (trx) => {
    // One person's borrows queue behind each other, so two at once cannot both slip under the limit
    // (the lock is on the membership row only). The space's lending rules come in the same round trip.
    const [member] = await borrowerLock(trx, ctx.spaceId, borrowerId);
    if (!member) throw new NotFoundError('That person is not a member of this space.');
    const settings = toLoanSettings(member);

    // Take the items first: a guarded update (box) or row locks in id order (units), so that of many
    // borrows of the same thing exactly one gets it and the rest see it gone.
    let lines: SelectionLine[];
    let boxId: string | null = null;
    let templateId: string | null = null;
    if ('kitBoxId' in sel) {
      const taken = await scoped(trx, ctx)
        .updateTable('kit_boxes')
        .set({ state: 'out' })
        .where('id', '=', sel.kitBoxId)
        .where('space_id', '=', ctx.spaceId)
        .where(takeable('kit_boxes', borrowerId))
        .returning(['id', 'template_id'])
        .executeTakeFirst();
      if (!taken) {
        const box = await loadBox(trx, ctx.spaceId, sel.kitBoxId);
        throw new ConflictError(`${box.name} is not available (${box.state.replace('_', ' ')}).`, {
          kitBoxId: ['not on the shelf'],
        });
      }
      boxId = taken.id;
      templateId = taken.template_id;
      lines = await boxLines(trx, ctx.spaceId, boxId);
      await scoped(trx, ctx)
        .updateTable('units')
        .set({ state: 'out', updated_at: now() })
        .where('kit_box_id', '=', boxId)
        .execute();
    } else {
      lines = await looseLines(trx, ctx.spaceId, sel);
      if (sel.unitIds.length) {
        const locked = await scoped(trx, ctx)
          .selectFrom('units')
          .select(['id', 'code'])
          .select(takeable('units', borrowerId).as('free'))
          .where('id', 'in', sel.unitIds)
          .where('space_id', '=', ctx.spaceId)
          .orderBy('id')
          .forUpdate()
          .execute();
        const gone = locked.filter((u) => !u.free);
        if (gone.length) {
          const fields = Object.fromEntries(
            gone.map((u) => [`unitIds.${sel.unitIds.indexOf(u.id)}`, ['not on the shelf']]),
          );
          throw new ConflictError(`Not available: ${gone.map((u) => u.code).join(', ')}.`, fields);
        }
        await scoped(trx, ctx)
          .updateTable('units')
          .set({ state: 'out', updated_at: now() })
          .where('id', 'in', sel.unitIds)
          .execute();
      }
    }

    // Standing: a member with kit overdue starts nothing new, whoever asks and however. Read under the
    // borrower's lock, after the take (a borrow that loses the race answers at once, as before); a refusal
    // rolls the take back with the rest of the transaction.
    const refusal = await standingRefusal(trx, ctx.spaceId, borrowerId, settings.rules, now(), {
      self: borrowerId === ctx.userId,
      timeZone: settings.timeZone,
    });
    if (refusal) throw new ConflictError(refusal.message, refusal.fields);

    // The check, on the server, on exactly these parts: a box on its contents, loose parts together
    // with the rest of the borrower's build (read under the borrower's lock taken above).
    const outcome = boxId
      ? checkLines(lines, { fromKitBox: true, ambientC: settings.ambientC })
      : await looseOutcome(trx, ctx.spaceId, borrowerId, lines, input.ownParts, settings.ambientC);
    const gate = gateFor(outcome);
    const reasons = refusalReasons(outcome, { self: borrowerId === ctx.userId });
    const said = reasons.length ? ` ${reasons.join('. ')}.` : '';
    if (gate === 'blocked' && !input.overrides.check)
      throw new ConflictError(
        `The compatibility check failed:${said} This cannot be lent as it is. A steward may override it with a written reason.`,
        {
          override: ['the check failed; a steward override with a reason is needed'],
          ...(outcome.build ? { build: reasons } : {}),
        },
      );
    if (gate === 'acknowledge' && !input.acknowledgeCaution)
      throw new ConflictError(
        `The check gave cautions:${said} Confirm that you read them before borrowing.`,
        {
          acknowledgeCaution: ['tick that you read the cautions'],
          ...(outcome.build ? { build: reasons } : {}),
        },
      );

    // The induction gate: what these things need, against the borrower's current sign-offs.
    const at = now();
    const missing = await missingInductions(
      trx,
      ctx.spaceId,
      borrowerId,
      { templateId, categories: lines.map((l) => l.category) },
      at,
    );
    if (missing.length && !input.overrides.inductions) {
      const refusal = inductionRefusal(missing, await stewardsToAsk(trx, ctx.spaceId), {
        self: borrowerId === ctx.userId,
        timeZone: settings.timeZone,
      });
      throw new ConflictError(refusal.message, refusal.fields);
    }
    const inductionOverride = missing.length ? input.overrides.inductions!.reason : null;

    const open = await openLoanCount(trx, ctx.spaceId, borrowerId);
    if (open >= settings.maxOpenLoans)
      throw new ConflictError(limitReached(settings.maxOpenLoans), {
        borrowerId: [`already has ${open} loans out`],
      });

    const dueAt = computeDueAt(at, settings);
    // Bench hand-over: a member's own borrow waits at the bench (kept for them) until a steward hands it
    // over; its due date is set again then. A steward lending at the bench is the hand-over.
    const startsAs = settings.rules.presence === 'bench_handover' && !staff ? ('waiting' as const) : ('out' as const);
    // A kit that asks for a deposit: kept for the borrower (waiting) until it is paid; then it becomes
    // what it would have been (lib/deposits/events.ts).
    // Loose parts: the space's deposit per part category in the borrow (a box's is its template's alone).
    const depositMinor = boxId
      ? await templateDeposit(trx, ctx.spaceId, templateId)
      : categoryDeposit(settings.rules.categoryDepositsMinor, lines.map((l) => l.category));
    const status = depositMinor ? ('waiting' as const) : startsAs;
    const overridden = gate === 'blocked';
    const loan = await scoped(trx, ctx)
      .insertInto('loans')
      .values({
        space_id: ctx.spaceId,
        borrower_id: borrowerId,
        lent_by_id: ctx.userId,
        kit_box_id: boxId,
        status,
        out_at: at,
        handed_over_by: status === 'out' && staff ? ctx.userId : null,
        handed_over_at: status === 'out' && staff ? at : null,
        due_at: dueAt,
        check_verdict: outcome.verdict,
        check_report: JSON.stringify(storedReport(outcome)),
        caution_acknowledged: gate === 'acknowledge',
        override_reason: overridden ? input.overrides.check!.reason : null,
        override_by: overridden ? ctx.userId : null,
        induction_override_reason: inductionOverride,
        induction_override_by: inductionOverride ? ctx.userId : null,
        own_parts: input.ownParts ? JSON.stringify(input.ownParts) : null,
        created_at: at,
      })
      .returning('id')
      .executeTakeFirstOrThrow();
    const deposit = depositMinor ? await recordDeposit(trx, ctx, { id: loan.id, amountMinor: depositMinor, startsAs }) : null;

    // Counted stock leaves its bin: guarded updates in a fixed order (no deadlock between two loans).
    const counted = lines
      .map((l, i) => ({ l, i }))
      .filter(({ l }) => l.locationId)
      .sort((a, b) => (a.l.partId + a.l.locationId).localeCompare(b.l.partId + b.l.locationId));
    for (const { l, i } of counted) {
      const [left] = await takeCounted(trx, ctx.spaceId, l.partId, l.locationId!, l.qty, at);
      if (!left)
        throw new ConflictError(`Not enough ${l.name} in ${l.locationName}.`, {
          [`counted.${i - (lines.length - counted.length)}.qty`]: ['more than the bin holds'],
        });
    }

    // The lines, their stock movements and the audit row: one statement (data-modifying CTEs).
    const moves = lines.filter((l) => l.unitId || l.locationId);
    const detail = {
      borrowerId,
      onBehalf: borrowerId !== ctx.userId,
      kitBoxId: boxId,
      items: lines.map((l) => ({ part: l.name, qty: l.qty, unit: l.unitCode })),
      verdict: outcome.verdict,
      cautionAcknowledged: gate === 'acknowledge',
      dueAt: dueAt.toISOString(),
      status,
      ...(deposit ? { depositMinor: deposit.amountMinor, currency: deposit.currency } : {}),
    };
    const withLines = scoped(trx, ctx).with('written_lines', (q) =>
      q
        .insertInto('loan_lines')
        .values(
          lines.map((l) => ({
            loan_id: loan.id,
            space_id: ctx.spaceId,
            part_id: l.partId,
            unit_id: l.unitId,
            location_id: l.locationId,
            qty: l.qty,
            chain_role: chainRoleOf(l),
          })),
        )
        .returning('loan_lines.id'),
    );
    // The audit row rides along as a CTE; PostgreSQL runs every data-modifying CTE once, read or not.
    const written = withLines.with('written_audit', (q) =>
      q
        .insertInto('audit_log')
        .values(
          auditRow({
            spaceId: ctx.spaceId,
            actorId: ctx.userId,
            action: 'loan.created',
            targetType: 'loan',
            targetId: loan.id,
            detail,
          }),
        )
        .returning('audit_log.id'),
    );
    if (moves.length)
      await written
        .insertInto('stock_movements')
        .values(
          moves.map((l) => ({
            space_id: ctx.spaceId,
            part_id: l.partId,
            location_id: l.locationId,
            unit_id: l.unitId,
            // Units are not counted stock: their movement records the event, quantity 0.
            qty_delta: l.unitId ? 0 : -l.qty,
            reason: 'loan_out' as const,
            ref_type: 'loan',
            ref_id: loan.id,
            actor_id: ctx.userId,
            created_at: at,
          })),
        )
        .execute();
    else await written.selectFrom('written_audit').select('written_audit.id').execute();

    // The borrower's own hold on what they now take is done.
    const unitIds = lines.flatMap((l) => (l.unitId ? [l.unitId] : []));
    if (boxId || unitIds.length)
      await scoped(trx, ctx)
        .updateTable('holds')
        .set({ status: 'fulfilled' })
        .where('user_id', '=', borrowerId)
        .where('space_id', '=', ctx.spaceId)
        .where('status', 'in', ['waiting', 'ready'])
        .where((eb) =>
          eb.or([
            ...(boxId ? [eb('kit_box_id', '=', boxId)] : []),
            ...(unitIds.length ? [eb('unit_id', 'in', unitIds)] : []),
          ]),
        )
        .execute();

    if (overridden)
      await audit(trx, {
        spaceId: ctx.spaceId,
        actorId: ctx.userId,
        action: 'loan.override',
        targetType: 'loan',
        targetId: loan.id,
        detail: {
          gate: 'check',
          reason: input.overrides.check!.reason,
          verdict: outcome.verdict,
          kind: outcome.kind,
          ...(outcome.build ? { build: reasons } : {}),
        },
      });
    if (inductionOverride)
      await audit(trx, {
        spaceId: ctx.spaceId,
        actorId: ctx.userId,
        action: 'loan.override',
        targetType: 'loan',
        targetId: loan.id,
        detail: { gate: 'inductions', reason: inductionOverride, missing: missing.map((m) => m.name) },
      });
    return {
      id: loan.id,
      status,
      dueAt,
      verdict: outcome.verdict,
      overridden,
      inductionsOverridden: missing.map((m) => m.name).filter(() => inductionOverride !== null),
      note: buildNote(outcome, { self: borrowerId === ctx.userId }),
      deposit,
    };
  });
}
