import 'server-only';
import { sql } from 'kysely';
import type { Db } from '@/db/connect';
import { scoped } from '@/db/scoped';
import { isStaff, type Ctx } from '@/lib/auth/roles';
import { now } from '@/lib/clock';
import { ForbiddenError, NotFoundError } from '@/lib/errors';
import { whatWorksWith, type Alternative } from './alternatives';
import { buildNote, looseOutcome } from './build';
import { checkLines, type CheckOutcome } from './check';
import { inductionRefusal, missingInductions, stewardsToAsk } from '@/lib/inductions/gate';
import { standingRefusal } from '@/lib/rules/standing';
import { computeDueAt } from './due';
import { limitReached, openLoanCount } from './lock';
import type { OwnParts, Selection } from './schemas';
import {
  chainRoleOf,
  resolveSelection,
  type ResolvedSelection,
  type SelectedBox,
  type SelectionLine,
} from './selection';
import { loanSettings } from './settings';
import { categoryDeposit } from '@/lib/deposits/take';
import { spaceClock } from '@/lib/sales/periods';

// What the member sees before borrowing: the parts, the check on exactly those parts, whether they can
// be taken now, the due date if so, and — when the check fails — what would work instead. Read only;
// borrow() repeats every step under locks and never trusts this answer.

export type Gate = 'ok' | 'acknowledge' | 'blocked';

export type Preview = {
  box: SelectedBox | null;
  lines: (SelectionLine & { free: boolean })[];
  outcome: CheckOutcome;
  gate: Gate;
  available: boolean;
  unavailable: string[];
  dueAt: Date;
  timeZone: string;
  alternatives: Alternative[];
  openLoans: number;
  maxOpenLoans: number;
  /** What was checked as the borrower's whole build, or what it still lacks. */
  note: string | null;
  /** Inductions the borrower has no current sign-off for, and what the answer would say; null when none. */
  inductions: { missing: string[]; message: string } | null;
  /** Loose parts only: the deposit their categories ask for (rules.categoryDepositsMinor), or null. */
  deposit: { amountMinor: number; currency: string } | null;
};

/** ok → lend; caution → lend once the borrower says they read the reasons; fail → only a steward's override. */
export function gateFor(outcome: CheckOutcome): Gate {
  return outcome.verdict === 'fail' ? 'blocked' : outcome.verdict === 'caution' ? 'acknowledge' : 'ok';
}

export async function previewLoan(
  db: Db,
  ctx: Ctx,
  sel: Selection,
  opts: {
    borrowerId?: string;
    ownParts?: OwnParts;
    /** The selection as the caller already read it (the box page reads a box and its lines once for both). */
    resolved?: ResolvedSelection;
  } = {},
): Promise<Preview> {
  // Only stewards and admins look at a loan for someone else (a steward lending at the bench).
  if (opts.borrowerId && opts.borrowerId !== ctx.userId && !isStaff(ctx))
    throw new ForbiddenError('Only a steward can check a build for someone else.');
  const borrowerId = opts.borrowerId ?? ctx.userId;
  // Someone of another space (or no one) is not found, as borrow() answers.
  if (borrowerId !== ctx.userId) {
    const member = await scoped(db, ctx)
      .selectFrom('memberships')
      .select('user_id')
      .where('space_id', '=', ctx.spaceId)
      .where('user_id', '=', borrowerId)
      .executeTakeFirst();
    if (!member) throw new NotFoundError('That person is not a member of this space.');
  }
  if (opts.resolved && !('kitBoxId' in sel && opts.resolved.box?.id === sel.kitBoxId))
    throw new Error('previewLoan: the resolved selection is not the one asked about');
  // The reads that need nothing but the selection and the borrower run side by side.
  const [settings, { box, lines }, readyFor, openLoans] = await Promise.all([
    loanSettings(db, ctx.spaceId),
    opts.resolved ?? resolveSelection(db, ctx.spaceId, sel),
    readyHoldTargets(db, ctx.spaceId, borrowerId),
    openLoanCount(db, ctx.spaceId, borrowerId),
  ]);
  const [missing, standing] = await Promise.all([
    missingInductions(
      db,
      ctx.spaceId,
      borrowerId,
      { templateId: box?.templateId ?? null, categories: lines.map((l) => l.category) },
      now(),
    ),
    standingRefusal(db, ctx.spaceId, borrowerId, settings.rules, now(), {
      self: borrowerId === ctx.userId,
      timeZone: settings.timeZone,
    }),
  ]);
  const inductions = missing.length
    ? {
        missing: missing.map((m) => m.name),
        message: inductionRefusal(missing, await stewardsToAsk(db, ctx.spaceId), {
          self: borrowerId === ctx.userId,
          timeZone: settings.timeZone,
        }).message,
      }
    : null;
  const outcome = box
    ? checkLines(lines, { fromKitBox: true, ambientC: settings.ambientC })
    : await looseOutcome(db, ctx.spaceId, borrowerId, lines, opts.ownParts, settings.ambientC);

  const unavailable: string[] = [];
  if (box && !(box.state === 'on_shelf' || (box.state === 'held' && readyFor.has(box.id))))
    unavailable.push(
      `${box.name} is ${box.state === 'held' ? 'held for someone else' : box.state.replace('_', ' ')}.`,
    );
  const withFree = await Promise.all(
    lines.map(async (l) => {
      let free = true;
      if (!box && l.unitId)
        free = l.unitState === 'on_shelf' || (l.unitState === 'held' && readyFor.has(l.unitId));
      if (l.locationId) {
        const s = await scoped(db, ctx)
          .selectFrom('stock')
          .select('qty')
          .where('part_id', '=', l.partId)
          .where('location_id', '=', l.locationId)
          .executeTakeFirst();
        free = (s?.qty ?? 0) >= l.qty;
      }
      if (!free)
        unavailable.push(
          l.unitCode
            ? `${l.name} (${l.unitCode}) is not on the shelf.`
            : `Not enough ${l.name} in ${l.locationName}.`,
        );
      return { ...l, free };
    }),
  );

  if (standing) unavailable.push(standing.message);
  if (openLoans >= settings.maxOpenLoans) unavailable.push(limitReached(settings.maxOpenLoans));

  const gate = gateFor(outcome);
  let alternatives: Alternative[] = [];
  if (outcome.kind === 'checked' && outcome.verdict === 'fail') {
    const pick = (role: 'supply' | 'driver') => lines.find((l) => chainRoleOf(l) === role)?.partId;
    alternatives = await whatWorksWith(db, ctx.spaceId, outcome.spec, {
      supplyPartId: pick('supply'),
      driverPartId: pick('driver'),
    });
  }

  const looseDeposit = box ? null : categoryDeposit(settings.rules.categoryDepositsMinor, lines.map((l) => l.category));
  return {
    box,
    lines: withFree,
    outcome,
    gate,
    available: unavailable.length === 0,
    unavailable,
    dueAt: computeDueAt(now(), settings),
    timeZone: settings.timeZone,
    alternatives,
    openLoans,
    maxOpenLoans: settings.maxOpenLoans,
    note: buildNote(outcome, { self: borrowerId === ctx.userId }),
    inductions,
    deposit: looseDeposit ? { amountMinor: looseDeposit, currency: (await spaceClock(db, ctx.spaceId)).currency } : null,
  };
}

/** Boxes and units held ready for this person: they may take them although they are not on the shelf. */
export async function readyHoldTargets(db: Db, spaceId: string, userId: string): Promise<Set<string>> {
  const rows = await scoped(db, { spaceId })
    .selectFrom('holds')
    .select(sql<string>`coalesce(kit_box_id, unit_id)`.as('target'))
    .where('space_id', '=', spaceId)
    .where('user_id', '=', userId)
    .where('status', '=', 'ready')
    .execute();
  return new Set(rows.map((r) => r.target));
}
