import 'server-only';
import type { Db } from '@/db/connect';
import type { Ctx } from '@/lib/auth/roles';
import { filingSaleLines } from '@/lib/reconcile/filing';
import { monthRange, spaceClock, type Month } from '@/lib/sales/periods';
import { costBases } from './cost-basis';
import { marginsByCategory, type CategoryMargin } from './margins';

/** The month's margins per category (lib/books/margins.ts), from the same sale lines as the filing file. */
export async function marginsOfMonth(db: Db, ctx: Pick<Ctx, 'spaceId'>, month: Month): Promise<{ rows: CategoryMargin[]; currency: string }> {
  const { timeZone, currency } = await spaceClock(db, ctx.spaceId);
  const range = monthRange(month, timeZone);
  const lines = await filingSaleLines(db, ctx, range, () => '');
  const bases = await costBases(db, ctx, lines.map((l) => l.partId), range.to);
  return { rows: marginsByCategory(lines, bases), currency };
}
