import 'server-only';
import type { Db } from '@/db/connect';
import { scoped } from '@/db/scoped';
import { env } from '@/lib/env';
import { log } from '@/lib/log';
import { formatMoney } from '@/lib/money';
import type { Charged } from '@/lib/charges/write';
import { sendMail } from './server';

// The notice a member gets when a steward charges them at a return: each charge with its item, kind and
// note, what the deposit covered, what goes back to the card and what is still owed. Sent after the commit;
// a mail failure is logged, never turned into a failed return.

export function chargeNoticeMessage(
  n: { name: string; spaceName: string; loanUrl: string; depositMinor: number | null },
  c: Charged,
) {
  const money = (x: number) => formatMoney(x, c.currency);
  const lines = c.charges.map(
    (x) => `  ${x.item}: ${money(x.amountMinor)}${x.fromDepositMinor ? ` (${money(x.fromDepositMinor)} kept from your deposit)` : ''}`,
  );
  const owed = c.charges.reduce((s, x) => s + x.owedMinor, 0);
  const back = c.release?.releasedMinor ?? 0;
  const deposit =
    n.depositMinor !== null
      ? `Your deposit was ${money(n.depositMinor)}; ${money(back)} of it goes back to your card.\n`
      : '';
  const text =
    `Hello ${n.name},\n\nA steward at ${n.spaceName} checked what you brought back and charged you for what was missing, damaged or late:\n\n` +
    `${lines.join('\n')}\n\n${deposit}${owed > 0 ? `Still owed: ${money(owed)}. Settle it with a steward at the bench.\n` : 'Nothing more is owed.\n'}` +
    `\nSee the loan: ${n.loanUrl}\n`;
  return { subject: `Charged at ${n.spaceName}: ${money(c.charges.reduce((s, x) => s + x.amountMinor, 0))}`, text };
}

export async function sendChargeNotice(db: Db, spaceId: string, loanId: string, charged: Charged): Promise<void> {
  if (!charged.charges.length) return;
  try {
    const row = await scoped(db, { spaceId })
      .selectFrom('loans')
      .innerJoin('users', 'users.id', 'loans.borrower_id')
      .innerJoin('spaces', 'spaces.id', 'loans.space_id')
      .leftJoin('deposits', 'deposits.loan_id', 'loans.id')
      .select(['users.name', 'users.email', 'spaces.name as spaceName', 'deposits.amount_minor'])
      .where('loans.id', '=', loanId)
      .executeTakeFirstOrThrow();
    const message = chargeNoticeMessage(
      {
        name: row.name,
        spaceName: row.spaceName,
        loanUrl: `${env().APP_BASE_URL.replace(/\/$/, '')}/loans/${loanId}`,
        depositMinor: row.amount_minor,
      },
      charged,
    );
    await sendMail({ to: row.email, ...message });
  } catch (err) {
    log.error({ loanId, err: err instanceof Error ? err.message : String(err) }, 'charge notice not sent');
  }
}
