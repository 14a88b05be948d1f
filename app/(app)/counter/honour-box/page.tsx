import Link from 'next/link';
import { db } from '@/db';
import { requirePageRole } from '@/lib/auth/guard';
import { honourBox } from '@/lib/honour-box/box';
import { formatDateTime } from '@/lib/format';
import { formatMoney } from '@/lib/money';
import { spaceClock } from '@/lib/sales/periods';
import { BoxForms } from '@/components/honour-box/box-forms';
import { PageTitle } from '@/components/ui/page-title';

export const metadata = { title: 'Honour box' };

export default async function HonourBoxPage() {
  const ctx = await requirePageRole('steward', 'admin');
  const { timeZone } = await spaceClock(db, ctx.spaceId);
  const box = await honourBox(db, ctx, { limit: 20 });
  const e = box.expected;
  const money = (n: number) => formatMoney(n, e.currency);
  const latest = box.counts[0] ?? null;
  return (
    <div className="mx-auto max-w-2xl space-y-5">
      <PageTitle title="Honour box" lead="Count the cash in the box against what the books say it should hold, then bank it.">
        <Link href="/counter" className="btn-quiet">
          Back to the counter
        </Link>
      </PageTitle>
      <section className="card space-y-1" aria-label="What the box should hold">
        <p className="text-lg">
          The box should hold <strong data-testid="box-expected">{money(e.expectedMinor)}</strong>
        </p>
        <p className="muted text-sm">
          {e.since ? `Left after the last count (${formatDateTime(e.since, timeZone)})` : 'Before any count'}: {money(e.carriedMinor)}
          {' · '}cash sales since: {money(e.cashSalesMinor)}
          {' · '}cash given back since: {money(e.cashRefundsMinor)}
        </p>
      </section>
      <BoxForms
        currency={e.currency}
        expectedMinor={e.expectedMinor}
        latest={latest ? { id: latest.id, countedMinor: latest.countedMinor, banked: latest.banking !== null } : null}
      />
      <section aria-labelledby="box-history" className="space-y-2">
        <h2 id="box-history" className="text-lg font-bold">
          Counts and bankings
        </h2>
        {box.counts.length === 0 ? <p className="muted">The box has not been counted yet.</p> : null}
        <ul className="space-y-2" data-testid="box-counts">
          {box.counts.map((c) => (
            <li key={c.id} className="card space-y-1 text-sm">
              <p className="font-semibold">
                {formatDateTime(c.countedAt, timeZone)} · {c.countedBy ?? 'someone no longer here'}
              </p>
              <p>
                Expected {money(c.expectedMinor)}, counted {money(c.countedMinor)}
                {c.differenceMinor === 0
                  ? ' (matches)'
                  : ` (${c.differenceMinor > 0 ? 'over' : 'short'} by ${money(Math.abs(c.differenceMinor))})`}
              </p>
              {c.note ? <p className="muted break-words">“{c.note}”</p> : null}
              <p>
                {c.banking
                  ? `Banked ${money(c.banking.amountMinor)} on ${formatDateTime(c.banking.bankedAt, timeZone)}${c.banking.bankedBy ? ` by ${c.banking.bankedBy}` : ''}${c.banking.reference ? ` (ref. ${c.banking.reference})` : ''}`
                  : 'Not banked'}
              </p>
            </li>
          ))}
        </ul>
      </section>
    </div>
  );
}
