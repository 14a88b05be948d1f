import Link from 'next/link';
import { formatQty } from '@/lib/inventory/measure';
import { db } from '@/db';
import { requirePageRole } from '@/lib/auth/guard';
import { countOf } from '@/lib/format';
import { formatMoney } from '@/lib/money';
import { listSuppliers } from '@/lib/restock/suppliers';
import { spaceClock } from '@/lib/sales/periods';
import { PageTitle } from '@/components/ui/page-title';
import { OfferForm, RemoveOffer, SupplierForm } from '@/components/restock/supplier-forms';
import { OffersCsv } from '@/components/restock/offers-csv';

export const metadata = { title: 'Suppliers' };

export default async function SuppliersPage() {
  const ctx = await requirePageRole('steward', 'admin');
  const [suppliers, { currency }] = await Promise.all([listSuppliers(db, ctx), spaceClock(db, ctx.spaceId)]);
  const money = (n: number) => formatMoney(n, currency);
  return (
    <div className="space-y-4">
      <Link href="/orders" className="inline-block min-h-11 content-center text-sm">
        ← Restock
      </Link>
      <PageTitle title="Suppliers" lead="Where the bench buys its parts, and what each sells us: their reference, the pack, the price per pack." />
      {suppliers.map((s) => (
        <article key={s.id} className="card space-y-2" aria-label={s.name}>
          <h2 className="text-lg font-bold break-words">
            {s.name}
            {s.archived ? <span className="muted text-sm font-normal"> (archived)</span> : null}
          </h2>
          <p className="text-sm break-words">
            {s.email || 'No contact e-mail'}
            {s.website ? (
              <>
                {' · '}
                <a href={s.website} rel="noreferrer">
                  {s.website}
                </a>
              </>
            ) : null}
            {` · ${countOf(s.leadDays, 'day')} lead time`}
            {s.minOrderMinor ? ` · minimum order ${money(s.minOrderMinor)}` : ''}
          </p>
          {s.notes ? <p className="muted text-sm">{s.notes}</p> : null}
          <details>
            <summary className="min-h-11 cursor-pointer content-center font-semibold">{countOf(s.offers.length, 'offer')}</summary>
            <ul className="divide-y divide-stone-200 dark:divide-stone-800">
              {s.offers.map((o) => (
                <li key={o.id} className="flex flex-wrap items-center justify-between gap-2 py-2 text-sm">
                  <span className="min-w-0 break-words">
                    <Link href={`/shelf/parts/${o.partId}`}>{o.partName}</Link>
                    {o.itemRef ? ` · ${o.itemRef}` : ''} · pack of {formatQty(o.packSize, o.saleUnit)} at {money(o.packPriceMinor)}
                    {o.preferred ? <strong> · ordered from here</strong> : null}
                  </span>
                  <RemoveOffer offerId={o.id} label={`Remove the offer for ${o.partName}`} />
                </li>
              ))}
            </ul>
          </details>
        </article>
      ))}
      <SupplierForm currency={currency} />
      <OffersCsv />
      <OfferForm currency={currency} suppliers={suppliers.filter((s) => !s.archived).map((s) => ({ id: s.id, name: s.name }))} />
    </div>
  );
}
