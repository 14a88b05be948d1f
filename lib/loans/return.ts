import 'server-only';
import type { Db } from '@/db/connect';
import { scoped } from '@/db/scoped';
import { audit } from '@/lib/audit/log';
import { isStaff, type Ctx } from '@/lib/auth/roles';
import { now } from '@/lib/clock';
import { ForbiddenError, InvalidError } from '@/lib/errors';
import { chargeAndRelease, type ChargeLine, type Charged } from '@/lib/charges/write';
import { lateFeeLine } from '@/lib/charges/late';
import { releaseItem } from './holds';
import { reportBack } from './handover';
import { lockOpenLoan } from './lock';
import { loanSettings } from './settings';
import type { ReturnInput } from './schemas';

// Returning, in one transaction: each line checked off as back in good order, missing or damaged.
// What did not come back becomes a stock movement ('lost' / 'damaged'); a lost unit is retired, a
// damaged one goes to repair. A box that came back short waits in repair for a refill; everything else
// goes back on the shelf, or to the next person holding it (told by e-mail after commit).
//
// Movements: location_id set means that bin's stock row changed by qty_delta; location_id null means
// no stock row changed and the movement records parts written off from a box or a loan.

export type ReturnResult = {
  status: 'returned' | 'returned_short' | 'back_unchecked';
  readyHoldIds: string[];
  short: number;
  /** Charges written and the deposit's split (kept / given back); null when neither applies. */
  charged: Charged | null;
  /** A deposit whose release was fixed here: its refund goes to the processor after the commit. */
  depositToSend: string | null;
};

type Condition = 'ok' | 'missing' | 'damaged';

export async function returnLoan(
  db: Db,
  ctx: Ctx,
  loanId: string,
  input: ReturnInput,
): Promise<ReturnResult> {
  const staff = isStaff(ctx);
  const settings = await loanSettings(db, ctx.spaceId);
  const { rules } = settings;
  if (!staff && input.lines?.some((l) => l.chargeMinor !== undefined))
    throw new ForbiddenError('Only a steward can charge for what is missing or damaged.');
  return db.transaction().execute(async (trx) => {
    // A steward confirms a return the member reported (bench hand-over) like any other return.
    const loan = await lockOpenLoan(trx, ctx, loanId, 'This loan is already returned.', staff ? ['out', 'back_unchecked'] : ['out']);
    // A held deposit goes back only on a steward's check of what came back, whatever the presence rule.
    const deposit = await scoped(trx, ctx)
      .selectFrom('deposits')
      .select('status')
      .where('loan_id', '=', loan.id)
      .where('status', '=', 'held')
      .executeTakeFirst();
    if (!staff && (rules.presence === 'bench_handover' || deposit)) {
      // Bench hand-over: the member's word that it is back; nothing moves until a steward has checked it.
      await reportBack(trx, ctx, loan, input.note);
      return { status: 'back_unchecked', readyHoldIds: [], short: 0, charged: null, depositToSend: null };
    }

    const lines = await scoped(trx, ctx)
      .selectFrom('loan_lines')
      .innerJoin('parts', 'parts.id', 'loan_lines.part_id')
      .select([
        'loan_lines.id',
        'loan_lines.part_id',
        'loan_lines.unit_id',
        'loan_lines.location_id',
        'loan_lines.qty',
        'parts.name',
      ])
      .where('loan_id', '=', loan.id)
      .orderBy('loan_lines.id')
      .execute();
    const given = new Map((input.lines ?? []).map((l, i) => [l.lineId, { ...l, i }]));
    if (input.lines) {
      for (const [lineId, g] of given)
        if (!lines.some((l) => l.id === lineId))
          throw new InvalidError('A line is not part of this loan.', {
            [`lines.${g.i}.lineId`]: ['not on this loan'],
          });
      const missingLines = lines.filter((l) => !given.has(l.id));
      if (missingLines.length)
        throw new InvalidError(`Check off every line (${missingLines.map((l) => l.name).join(', ')}).`, {
          lines: ['every line of the loan must be listed'],
        });
    }

    const at = now();
    let short = 0;
    const checked = lines.map((l) => {
      const g = given.get(l.id);
      const returnedQty = g ? g.returnedQty : l.qty;
      const condition: Condition = g ? g.condition : 'ok';
      const field = g ? `lines.${g.i}` : 'lines';
      if (returnedQty > l.qty)
        throw new InvalidError(`${l.name}: more back than was lent.`, {
          [`${field}.returnedQty`]: [`at most ${l.qty}`],
        });
      if (condition === 'ok' && returnedQty !== l.qty)
        throw new InvalidError(`${l.name}: say whether the rest is missing or damaged.`, {
          [`${field}.condition`]: ['some did not come back in good order'],
        });
      if (condition !== 'ok' && returnedQty === l.qty)
        throw new InvalidError(`${l.name}: the returned quantity must leave out what is ${condition}.`, {
          [`${field}.returnedQty`]: [`less than ${l.qty}`],
        });
      if (g?.chargeMinor !== undefined && condition === 'ok')
        throw new InvalidError(`${l.name}: a charge is only for what is missing or damaged.`, {
          [`${field}.chargeMinor`]: ['only on a line missing or damaged'],
        });
      short += l.qty - returnedQty;
      return { ...l, returnedQty, condition, chargeMinor: g?.chargeMinor, chargeNote: g?.chargeNote ?? '' };
    });

    const status = short > 0 ? 'returned_short' : 'returned';
    await scoped(trx, ctx)
      .updateTable('loans')
      .set({ status, returned_at: at, return_note: input.note ?? '' })
      .where('id', '=', loan.id).execute();
    for (const l of checked)
      await scoped(trx, ctx)
        .updateTable('loan_lines')
        .set({ returned_qty: l.returnedQty, return_condition: l.condition })
        .where('id', '=', l.id)
        .execute();

    const move = (
      l: (typeof checked)[number],
      reason: 'loan_return' | 'lost' | 'damaged',
      qty: number,
      locationId: string | null,
    ) => ({
      space_id: ctx.spaceId,
      part_id: l.part_id,
      location_id: locationId,
      unit_id: l.unit_id,
      qty_delta: qty,
      reason,
      ref_type: 'loan',
      ref_id: loan.id,
      note: input.note ?? '',
      actor_id: ctx.userId,
      created_at: at,
    });
    const movements: ReturnType<typeof move>[] = [];
    const freed: string[] = [];

    for (const l of checked) {
      const lostReason = l.condition === 'damaged' ? 'damaged' : 'lost';
      if (l.unit_id) {
        if (l.condition === 'ok') {
          movements.push(move(l, 'loan_return', 0, null));
          if (!loan.kit_box_id) freed.push(l.unit_id);
        } else {
          // Out of the box for good: a damaged unit waits for repair, a lost one is retired; a damaged one
          // the borrower is charged for is written off (retired) too — it is paid for.
          await scoped(trx, ctx)
            .updateTable('units')
            .set({
              state: l.condition === 'damaged' && l.chargeMinor === undefined ? 'in_repair' : 'retired',
              kit_box_id: null,
              updated_at: at,
            })
            .where('id', '=', l.unit_id)
            .execute();
          if (loan.kit_box_id)
            await scoped(trx, ctx)
              .deleteFrom('kit_box_contents')
              .where('kit_box_id', '=', loan.kit_box_id)
              .where('unit_id', '=', l.unit_id)
              .execute();
          movements.push(move(l, lostReason, 0, null));
        }
        continue;
      }
      const shortQty = l.qty - l.returnedQty;
      if (l.location_id) {
        // Loose counted stock: what came back goes back into its bin.
        if (l.returnedQty > 0) {
          await scoped(trx, ctx)
            .insertInto('stock')
            .values({
              space_id: ctx.spaceId,
              part_id: l.part_id,
              location_id: l.location_id,
              qty: l.returnedQty,
              updated_at: at,
            })
            .onConflict((oc) =>
              oc
                .columns(['part_id', 'location_id'])
                .doUpdateSet((eb) => ({ qty: eb('stock.qty', '+', l.returnedQty), updated_at: at })),
            )
            .execute();
          movements.push(move(l, 'loan_return', l.returnedQty, l.location_id));
        }
      } else if (shortQty > 0 && loan.kit_box_id) {
        // Counted contents of a box: the box now holds fewer.
        const content = await scoped(trx, ctx)
          .selectFrom('kit_box_contents')
          .select(['id', 'qty'])
          .where('kit_box_id', '=', loan.kit_box_id)
          .where('part_id', '=', l.part_id)
          .where('unit_id', 'is', null)
          .forUpdate()
          .executeTakeFirst();
        if (content) {
          if (content.qty > shortQty)
            await scoped(trx, ctx)
              .updateTable('kit_box_contents')
              .set({ qty: content.qty - shortQty })
              .where('id', '=', content.id)
              .execute();
          else await scoped(trx, ctx).deleteFrom('kit_box_contents').where('id', '=', content.id).execute();
        }
      }
      if (shortQty > 0) movements.push(move(l, lostReason, -shortQty, null));
    }
    if (movements.length) await scoped(trx, ctx).insertInto('stock_movements').values(movements).execute();

    const readyHoldIds: string[] = [];
    if (loan.kit_box_id) {
      await scoped(trx, ctx)
        .updateTable('units')
        .set({ state: 'on_shelf', updated_at: at })
        .where('kit_box_id', '=', loan.kit_box_id)
        .execute();
      if (short > 0)
        await scoped(trx, ctx)
          .updateTable('kit_boxes')
          .set({ state: 'in_repair' })
          .where('id', '=', loan.kit_box_id)
          .execute();
      else {
        const ready = await releaseItem(trx, ctx.spaceId, { kitBoxId: loan.kit_box_id });
        if (ready) readyHoldIds.push(ready);
      }
    }
    for (const unitId of freed) {
      const ready = await releaseItem(trx, ctx.spaceId, { unitId });
      if (ready) readyHoldIds.push(ready);
    }

    // Charges for what is missing or damaged, from the deposit first; the rest of the deposit goes back.
    const toCharge: ChargeLine[] = checked.flatMap((l) =>
      l.chargeMinor !== undefined && l.condition !== 'ok'
        ? [{ lineId: l.id, item: l.name, kind: l.condition, amountMinor: l.chargeMinor, note: l.chargeNote }]
        : [],
    );
    // A late fee where the space has one, after the parts' charges (so the deposit covers those first).
    const late = await lateFeeLine(trx, ctx.spaceId, loan.id, settings, at);
    if (late) toCharge.push(late);
    const charged = await chargeAndRelease(trx, ctx.spaceId, loan, toCharge, ctx.userId);

    await audit(trx, {
      spaceId: ctx.spaceId,
      actorId: ctx.userId,
      action: 'loan.returned',
      targetType: 'loan',
      targetId: loan.id,
      detail: {
        status,
        byBorrower: ctx.userId === loan.borrower_id,
        lines: checked.map((l) => ({
          part: l.name,
          qty: l.qty,
          returned: l.returnedQty,
          condition: l.condition,
        })),
        ...(input.note ? { note: input.note } : {}),
      },
    });
    return {
      status,
      readyHoldIds,
      short,
      charged: charged.charges.length || charged.release ? charged : null,
      depositToSend: charged.release?.toSend ? charged.release.depositId : null,
    };
  });
}
