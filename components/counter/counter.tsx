'use client';
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { Minus, Plus, Trash2 } from 'lucide-react';
import { useCallback, useId, useMemo, useState } from 'react';
import { useStoredBasket } from './basket-store';
import { callApi, errorText, type ApiError } from '@/components/loans/api';
import type { CatalogItem } from '@/lib/sales/catalog';
import { formatQty, measureOf, roundQty } from '@/lib/inventory/measure';
import { formatMoney, formatUnitPrice, lineAmountMinor } from '@/lib/money';
import { MeasuredQtyInput } from '@/components/ui/measured-qty-input';
import type { TaxMode } from '@/lib/domain';
import { receiptTaxLines, taxSale } from '@/lib/sales/tax';
import { CameraScan } from './camera-scan';
import { lookupCode } from './code-lookup';

type Props = {
  currency: string;
  items: CatalogItem[];
  me: string;
  /** Stewards ring sales up for members and record cash; members buy for themselves. */
  buyers: { id: string; name: string }[] | null;
  /** The space's tax rule and its name (receipts and the total say it in these words). */
  tax: { name: string; mode: TaxMode; rateBp: number };
  /** Smallest card payment in minor units; 0: any amount. */
  minCardMinor: number;
};

/** "12", "65.5 m", "420 g": what is on the shelf in the part's own unit. */
const onShelfWords = (item: CatalogItem) => formatQty(item.onShelf, item.saleUnit);

/** Why the basket cannot take one more of an item: the shelf has no more of it. */
const shelfLimit = (item: CatalogItem) =>
  item.onShelf === 0
    ? `${item.name} is not on the shelf.`
    : `Only ${onShelfWords(item)} of ${item.name} on the shelf, and all of them are in the basket.`;

// The bench's till, for a phone held in one hand: scan or type a label, or pick from the list; the
// basket with big +/− targets; pay by card on the processor's page, or (a steward) record cash.
export function Counter({ currency, items: initial, me, buyers, tax, minCardMinor }: Props) {
  const ids = useId();
  const queryClient = useQueryClient();
  const catalog = useQuery({
    queryKey: ['counter-catalog'],
    queryFn: () => callApi<{ items: CatalogItem[] }>('/api/sales/catalog', 'GET').then((r) => r.items),
    initialData: initial,
  });
  const items = catalog.data;
  // Kept in this tab until the sale is paid or ends unpaid: going back from the card page finds it again.
  const { basket, update: setBasket, markPending, clear: emptyBasket } = useStoredBasket(me);
  const [code, setCode] = useState('');
  const [search, setSearch] = useState('');
  const [note, setNote] = useState<string | null>(null);
  const [buyerId, setBuyerId] = useState(me);

  const byId = useMemo(() => new Map(items.map((i) => [i.id, i])), [items]);
  const lines = [...basket]
    .map(([id, qty]) => ({ item: byId.get(id), qty }))
    .filter((l): l is { item: CatalogItem; qty: number } => Boolean(l.item));
  // The same sum the server makes (lib/sales/tax.ts: once per sale, half away from zero).
  const taxed = taxSale(
    lines.reduce((s, l) => s + lineAmountMinor(l.qty, l.item.priceMinor), 0),
    tax,
  );
  const total = taxed.totalMinor;
  const taxLines = receiptTaxLines({ ...tax, taxMinor: taxed.taxMinor, totalMinor: total });
  const money = (n: number) => formatMoney(n, currency);
  const belowCardMinimum = lines.length > 0 && minCardMinor > 0 && total < minCardMinor;

  /** Changes a line by `by`; never past what is on the shelf, and says so when it stops. True if it changed. */
  const add = useCallback(
    (item: CatalogItem, by = 1) => {
      const had = basket.get(item.id) ?? 0;
      const wanted = Math.max(0, roundQty(had + by));
      const qty = Math.min(item.onShelf, wanted);
      setBasket((b) => {
        const next = new Map(b);
        if (qty === 0) next.delete(item.id);
        else next.set(item.id, qty);
        return next;
      });
      setNote(wanted > qty ? shelfLimit(item) : null);
      return qty !== had;
    },
    [basket, setBasket],
  );

  const onCode = useCallback(
    (text: string) => {
      const found = lookupCode(text, items);
      if ('item' in found) {
        if (add(found.item)) setNote(`Added ${found.item.name}.`);
        setCode('');
      } else setNote(found.message);
    },
    [items, add],
  );

  const body = () => ({
    lines: lines.map((l) => ({ partId: l.item.id, qty: l.qty })),
    ...(buyerId !== me ? { buyerId } : {}),
  });
  const card = useMutation({
    mutationFn: () => callApi<{ sale: { id: string }; url: string }>('/api/sales', 'POST', body()),
    onSuccess: ({ sale, url }) => {
      markPending(sale.id);
      window.location.assign(url);
    },
  });
  const cash = useMutation({
    mutationFn: () =>
      callApi<{ sale: { id: string; totalMinor: number } }>('/api/sales/cash', 'POST', body()),
    onSuccess: ({ sale }) => {
      emptyBasket();
      setNote(`Cash sale of ${money(sale.totalMinor)} recorded. Put the money in the honour box.`);
      void queryClient.invalidateQueries({ queryKey: ['counter-catalog'] });
    },
  });
  // A member's own cash purchase at the honour box: they are the buyer and the one who records it.
  const honour = useMutation({
    mutationFn: () =>
      callApi<{ sale: { id: string; totalMinor: number } }>('/api/sales/honour-box', 'POST', {
        lines: lines.map((l) => ({ partId: l.item.id, qty: l.qty })),
      }),
    onSuccess: ({ sale }) => {
      emptyBasket();
      setNote(
        `Recorded: you put ${money(sale.totalMinor)} in the honour box. Your receipt is on its way by e-mail.`,
      );
      void queryClient.invalidateQueries({ queryKey: ['counter-catalog'] });
    },
  });
  const failure = (card.error ?? cash.error ?? honour.error) as ApiError | null;
  const lineProblem = (index: number) =>
    failure?.fields?.[`lines.${index}.qty`]?.[0] ?? failure?.fields?.[`lines.${index}.partId`]?.[0];
  const busy = card.isPending || cash.isPending || honour.isPending;

  const shown = items.filter((i) => {
    const q = search.trim().toLowerCase();
    return !q || i.name.toLowerCase().includes(q) || i.sku.toLowerCase().includes(q);
  });

  // On a phone: code and camera, then the basket, then the list; on a laptop the basket sits on the
  // right beside both.
  return (
    <div className="grid gap-4 md:grid-cols-2">
      <section aria-labelledby={`${ids}-find`} className="card space-y-3 md:col-start-1 md:row-start-1">
        <h2 id={`${ids}-find`} className="text-lg font-bold">
          Scan or type a label
        </h2>
        <form
          onSubmit={(e) => {
            e.preventDefault();
            onCode(code);
          }}
          className="flex gap-2"
        >
          <div className="min-w-0 flex-1">
            <label htmlFor={`${ids}-code`} className="label">
              Label code
            </label>
            <input
              id={`${ids}-code`}
              className="field font-mono uppercase"
              value={code}
              onChange={(e) => setCode(e.target.value)}
              autoComplete="off"
              autoCapitalize="characters"
              spellCheck={false}
              placeholder="K7F2-QX9"
            />
          </div>
          <button type="submit" className="btn-primary self-end">
            Add
          </button>
        </form>
        <CameraScan onCode={onCode} />
        <p aria-live="polite" className="min-h-6 text-sm">
          {note}
        </p>
      </section>

      <section
        aria-labelledby={`${ids}-basket`}
        className="card space-y-3 md:sticky md:top-4 md:col-start-2 md:row-span-2 md:row-start-1 md:self-start"
      >
        <h2 id={`${ids}-basket`} className="text-lg font-bold">
          Basket
        </h2>
        {lines.length === 0 ? <p className="muted">Empty. Scan a label or add from the list.</p> : null}
        <ul className="space-y-2" aria-label="Basket lines">
          {lines.map((l, index) => (
            <li key={l.item.id} className="rounded-lg border border-stone-200 p-2 dark:border-stone-700">
              <p className="font-semibold break-words">{l.item.name}</p>
              <p className="muted text-sm">{formatUnitPrice(l.item.priceMinor, currency, l.item.saleUnit)}</p>
              <div className="mt-1 flex items-center justify-between gap-2">
                {measureOf(l.item.saleUnit) !== 'each' ? (
                  <div className="flex items-center gap-1">
                    <label htmlFor={`${ids}-qty-${l.item.id}`} className="sr-only">
                      {l.item.saleUnit === 'metre' ? 'Metres' : 'Grams'} of {l.item.name}
                    </label>
                    <MeasuredQtyInput
                      id={`${ids}-qty-${l.item.id}`}
                      measure={measureOf(l.item.saleUnit)}
                      value={l.qty}
                      min={0.001}
                      invalid={Boolean(lineProblem(index))}
                      onChange={(q) => {
                        if (q !== null && q > 0) add(l.item, roundQty(q - l.qty));
                      }}
                    />
                    <RemoveLine name={l.item.name} onRemove={() => add(l.item, -l.qty)} />
                  </div>
                ) : (
                  <div className="flex items-center gap-1">
                    <button
                      type="button"
                      className="btn-quiet px-3"
                      onClick={() => add(l.item, -1)}
                      aria-label={`One fewer ${l.item.name}`}
                    >
                      <Minus aria-hidden className="size-5" />
                    </button>
                    <span
                      className="min-w-10 text-center text-lg font-bold"
                      aria-label={`Quantity of ${l.item.name}`}
                    >
                      {l.qty}
                    </span>
                    {/* At the shelf's stock "+" stays reachable and says why it adds nothing (below). */}
                    <button
                      type="button"
                      className="btn-quiet px-3 aria-disabled:opacity-50"
                      onClick={() => add(l.item, 1)}
                      aria-disabled={l.qty >= l.item.onShelf || undefined}
                      aria-describedby={l.qty >= l.item.onShelf ? `${ids}-limit-${l.item.id}` : undefined}
                      aria-label={`One more ${l.item.name}`}
                    >
                      <Plus aria-hidden className="size-5" />
                    </button>
                    <RemoveLine name={l.item.name} onRemove={() => add(l.item, -l.qty)} />
                  </div>
                )}
                <span className="font-semibold tabular-nums">
                  {money(lineAmountMinor(l.qty, l.item.priceMinor))}
                </span>
              </div>
              {l.qty >= l.item.onShelf ? (
                <p id={`${ids}-limit-${l.item.id}`} role="status" className="muted mt-1 text-sm">
                  That is all {onShelfWords(l.item)} on the shelf.
                </p>
              ) : null}
              {lineProblem(index) ? (
                <p className="mt-1 text-sm font-semibold text-red-800 dark:text-red-300">
                  {lineProblem(index)}
                </p>
              ) : null}
            </li>
          ))}
        </ul>
        {lines.length
          ? taxLines.before.map((l) => (
              <p
                key={l.label}
                className="flex items-baseline justify-between border-t border-stone-200 pt-2 dark:border-stone-700"
              >
                <span>{l.label}</span>
                <span
                  className="tabular-nums"
                  data-testid={l.label === 'Subtotal' ? 'basket-subtotal' : 'basket-tax'}
                >
                  {money(l.minor)}
                </span>
              </p>
            ))
          : null}
        <p className="flex items-baseline justify-between border-t border-stone-200 pt-2 text-xl font-bold dark:border-stone-700">
          <span>Total</span>
          <span className="tabular-nums" data-testid="basket-total">
            {money(total)}
          </span>
        </p>
        {lines.length
          ? taxLines.after.map((l) => (
              <p key={l.label} className="muted flex items-baseline justify-between text-sm">
                <span>{l.label}</span>
                <span className="tabular-nums" data-testid="basket-tax">
                  {money(l.minor)}
                </span>
              </p>
            ))
          : null}

        {buyers ? (
          <div>
            <label htmlFor={`${ids}-buyer`} className="label">
              Selling to
            </label>
            <select
              id={`${ids}-buyer`}
              className="field"
              value={buyerId}
              onChange={(e) => setBuyerId(e.target.value)}
            >
              {buyers.map((b) => (
                <option key={b.id} value={b.id}>
                  {b.id === me ? `${b.name} (me)` : b.name}
                </option>
              ))}
            </select>
          </div>
        ) : null}

        {failure ? (
          <p
            role="alert"
            className="rounded-lg border border-red-700 bg-red-50 p-2 text-sm text-red-900 dark:bg-red-950 dark:text-red-200"
          >
            {errorText(failure)}
          </p>
        ) : null}
        {belowCardMinimum ? (
          <p
            role="status"
            className="rounded-lg border border-amber-700 bg-amber-50 p-2 text-sm text-amber-950 dark:bg-amber-950 dark:text-amber-100"
            data-testid="cash-only"
          >
            Cash only for this basket: card payments start at {money(minCardMinor)} here, because on a smaller
            sale the card fees eat most of the money.
          </p>
        ) : (
          <button
            type="button"
            className="btn-primary w-full py-3 text-lg"
            disabled={lines.length === 0 || busy}
            onClick={() => card.mutate()}
          >
            {card.isPending ? 'Opening the card payment…' : `Pay ${money(total)} by card`}
          </button>
        )}
        {!buyers ? (
          <button
            type="button"
            className={`${belowCardMinimum ? 'btn-primary py-3 text-lg' : 'btn-quiet'} w-full`}
            disabled={lines.length === 0 || busy}
            onClick={() => honour.mutate()}
          >
            {honour.isPending ? 'Recording…' : `I put ${money(total)} cash in the honour box`}
          </button>
        ) : null}
        {buyers ? (
          <button
            type="button"
            className={`${belowCardMinimum ? 'btn-primary py-3 text-lg' : 'btn-quiet'} w-full`}
            disabled={lines.length === 0 || busy}
            onClick={() => cash.mutate()}
          >
            {cash.isPending ? 'Recording…' : `Record ${money(total)} cash into the honour box`}
          </button>
        ) : null}
        <p className="muted text-sm">
          Card payments open the card processor’s page; nothing leaves the shelf until the payment is
          confirmed.
        </p>
      </section>

      <section aria-labelledby={`${ids}-list`} className="card space-y-3 md:col-start-1 md:row-start-2">
        <h2 id={`${ids}-list`} className="text-lg font-bold">
          Or pick from the shelf
        </h2>
        <div>
          <label htmlFor={`${ids}-search`} className="label">
            Search the shelf
          </label>
          <input
            id={`${ids}-search`}
            className="field"
            type="search"
            value={search}
            onChange={(e) => setSearch(e.target.value)}
            placeholder="heat-shrink, LED, wire…"
          />
        </div>
        <ul className="divide-y divide-stone-200 dark:divide-stone-800" aria-label="Items for sale">
          {shown.map((i) => (
            <li key={i.id} className="flex items-center justify-between gap-3 py-2">
              <div className="min-w-0">
                <p className="font-semibold break-words">{i.name}</p>
                <p className="muted text-sm">
                  {formatUnitPrice(i.priceMinor, currency, i.saleUnit)} · {onShelfWords(i)} on the shelf
                  {i.onShelf > 0 && (basket.get(i.id) ?? 0) >= i.onShelf ? ', all in the basket' : ''}
                </p>
              </div>
              <button
                type="button"
                className="btn-quiet shrink-0"
                onClick={() => add(i)}
                disabled={i.onShelf === 0}
                aria-label={`Add ${i.name}`}
              >
                <Plus aria-hidden className="size-5" /> Add
              </button>
            </li>
          ))}
          {shown.length === 0 ? <li className="muted py-2">Nothing matches.</li> : null}
        </ul>
      </section>
    </div>
  );
}

/** Takes a whole line out of the basket, whether it is counted in items or measured in metres or grams. */
function RemoveLine({ name, onRemove }: { name: string; onRemove: () => void }) {
  return (
    <button type="button" className="btn-quiet px-3" onClick={onRemove} aria-label={`Remove ${name}`}>
      <Trash2 aria-hidden className="size-5" />
    </button>
  );
}
