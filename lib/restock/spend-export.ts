import 'server-only';
import type { Db } from '@/db/connect';
import type { Ctx } from '@/lib/auth/roles';
import { moneyRules } from '@/lib/money-rules/settings';
import { monthRange, spaceClock, type Month } from '@/lib/sales/periods';
import { purchasesReceived } from './purchases';
import { spendCsv } from './spend-csv';

/** The month's spend (purchases received at the price paid) as CSV, for treasurers and admins. */
export async function spendExport(db: Db, ctx: Pick<Ctx, 'spaceId'>, month: Month): Promise<string> {
  const { timeZone } = await spaceClock(db, ctx.spaceId);
  const lines = await purchasesReceived(db, ctx, monthRange(month, timeZone));
  const { accountCodes } = await moneyRules(db, ctx.spaceId);
  return spendCsv(lines, { month, timeZone, accountCodes });
}
