import 'server-only';
import { db } from '@/db';
import type { Ctx } from '@/lib/auth/roles';
import { now } from '@/lib/clock';
import { sendReceipts } from '@/lib/mail/sales';
import { paymentsClient } from '@/lib/payments/client';
import type { Month } from '@/lib/sales/periods';
import { processorError } from '@/lib/sales/processor-errors';
import { sweepOverdueSales, type SweepResult } from '@/lib/sales/sweep';
import { monthToShow } from './months';
import { reconcileMonth, type Reconciliation } from './report';
import { filingMonth } from './filing';
import { filingTotals } from './filing-totals';

// The app's entry points to the books (pages and route handlers share them): the space's processor
// client, the sweep before every look at the books, receipts for sales the sweep found paid.

/** The month asked for (a 400 naming `month` when it has not begun), else the latest with activity. */
export async function monthForBooks(ctx: Ctx, month: Month | undefined): Promise<Month> {
  return monthToShow(db, ctx.spaceId, month, now());
}

/** Settles overdue pending sales with the processor (an unreachable processor leaves them for next time). */
export async function sweepForBooks(ctx: Ctx): Promise<SweepResult> {
  const result = await sweepOverdueSales(db, paymentsClient(ctx.spaceId), {
    spaceId: ctx.spaceId,
    now: now(),
  }).catch((err: unknown) => {
    throw processorError(err, 'settle the sales still waiting for it');
  });
  await sendReceipts(db, result.receipts);
  return result;
}

export async function reconcileForBooks(ctx: Ctx, month: Month): Promise<Reconciliation> {
  try {
    return await reconcileMonth(db, ctx, paymentsClient(ctx.spaceId), month);
  } catch (err) {
    throw processorError(err, "read the processor's ledger");
  }
}

/** The month's reconciliation with its itemised books for filing and the sums of each section. */
export async function filingForBooks(ctx: Ctx, month: Month) {
  const report = await reconcileForBooks(ctx, month);
  const filing = await filingMonth(db, ctx, report);
  return { report, filing, totals: filingTotals(filing) };
}
