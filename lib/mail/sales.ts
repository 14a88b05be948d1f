import 'server-only';
import type { Db } from '@/db/connect';
import { scoped } from '@/db/scoped';
import { env } from '@/lib/env';
import { formatQty } from '@/lib/inventory/measure';
import { formatMoney, formatUnitPrice, lineAmountMinor } from '@/lib/money';
import { saleRef } from '@/lib/sales/ref';
import { formatDateTimeWithZone } from '@/lib/zoned-time';
import { sendMail } from './server';
import { log } from '@/lib/log';
import type { TaxMode } from '@/lib/domain';
import { moneyRules } from '@/lib/money-rules/settings';
import { receiptTaxLines } from '@/lib/sales/tax';

const esc = (s: string) => s.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);

export type ReceiptData = {
  saleId: string;
  spaceName: string;
  timeZone: string;
  buyerName: string;
  method: 'card' | 'cash';
  currency: string;
  totalMinor: number;
  /** The tax the sale was made under (kept on the sale) and the name the space gives it. */
  tax: { name: string; mode: TaxMode; rateBp: number; taxMinor: number };
  paidAt: Date;
  lines: { name: string; qty: number; unitPriceMinor: number; saleUnit: string }[];
};

/** The receipt in our own words: what was bought, what it cost, our short reference, the local time and zone. */
export function receiptMessage(r: ReceiptData, appBaseUrl: string) {
  const ref = saleRef(r.saleId);
  const money = (n: number) => formatMoney(n, r.currency);
  // "3 × Cable ties", "2.5 m of Twin lead": a line's amount is round(qty × price), half away from zero.
  const qty = (l: ReceiptData['lines'][number]) =>
    l.saleUnit === 'each' ? `${l.qty} ×` : `${formatQty(l.qty, l.saleUnit)} of`;
  const amount = (l: ReceiptData['lines'][number]) => money(lineAmountMinor(l.qty, l.unitPriceMinor));
  const rows = r.lines.map(
    (l) => `  ${qty(l)} ${l.name} @ ${formatUnitPrice(l.unitPriceMinor, r.currency, l.saleUnit)} = ${amount(l)}`,
  );
  const when = formatDateTimeWithZone(r.paidAt, r.timeZone);
  const taxLines = receiptTaxLines({ ...r.tax, totalMinor: r.totalMinor });
  const textLine = (l: { label: string; minor: number }) => `  ${l.label} ${money(l.minor)}`;
  const htmlLine = (l: { label: string; minor: number }) =>
    `<tr><td>${esc(l.label)}</td><td style="text-align:right">${esc(money(l.minor))}</td></tr>`;
  const link = `${appBaseUrl.replace(/\/$/, '')}/counter/done?sale=${r.saleId}`;
  const paidBy = r.method === 'card' ? 'by card' : 'in cash (honour box)';
  return {
    subject: `Receipt ${ref} from ${r.spaceName}: ${money(r.totalMinor)}`,
    text:
      `Hello ${r.buyerName},\n\nThank you. You paid ${money(r.totalMinor)} ${paidBy} at the ${r.spaceName} bench on ${when}.\n\n` +
      `${[...rows, ...taxLines.before.map(textLine)].join('\n')}\n  Total ${money(r.totalMinor)}\n` +
      `${taxLines.after.map((l) => `${textLine(l)}\n`).join('')}\nReference: ${ref}\nSee the sale: ${link}\n`,
    html:
      `<p>Hello ${esc(r.buyerName)},</p><p>Thank you. You paid <strong>${esc(money(r.totalMinor))}</strong> ${paidBy} at the ${esc(r.spaceName)} bench on ${esc(when)}.</p>` +
      `<table><tbody>${r.lines
        .map(
          (l) =>
            `<tr><td>${esc(qty(l))} ${esc(l.name)}</td><td style="text-align:right">${esc(amount(l))}</td></tr>`,
        )
        .join('')}${taxLines.before.map(htmlLine).join('')}<tr><td><strong>Total</strong></td><td style="text-align:right"><strong>${esc(money(r.totalMinor))}</strong></td></tr>${taxLines.after.map(htmlLine).join('')}</tbody></table>` +
      `<p>Reference: ${esc(ref)} · <a href="${esc(link)}">See the sale</a></p>`,
  };
}

/** Sends the receipt of a paid sale to its buyer. Called after the payment's transaction committed. */
export async function sendSaleReceipt(db: Db, saleId: string): Promise<void> {
  // across spaces: called after the commit of a payment (webhook, sweep, till) with that sale's id.
  const sale = await db
    .selectFrom('sales')
    .innerJoin('spaces', 'spaces.id', 'sales.space_id')
    .innerJoin('users', 'users.id', 'sales.buyer_id')
    .select([
      'sales.id',
      'sales.space_id',
      'sales.method',
      'sales.currency',
      'sales.total_minor',
      'sales.tax_mode',
      'sales.tax_rate_bp',
      'sales.tax_minor',
      'sales.paid_at',
      'spaces.name as spaceName',
      'spaces.time_zone',
      'users.email',
      'users.name',
    ])
    .where('sales.id', '=', saleId)
    .executeTakeFirst();
  if (!sale?.paid_at) return;
  const lines = await scoped(db, { spaceId: sale.space_id })
    .selectFrom('sale_lines')
    .innerJoin('parts', 'parts.id', 'sale_lines.part_id')
    .select(['parts.name', 'parts.sale_unit', 'sale_lines.qty', 'sale_lines.unit_price_minor'])
    .where('sale_lines.sale_id', '=', saleId)
    .orderBy('parts.name')
    .execute();
  const message = receiptMessage(
    {
      saleId: sale.id,
      spaceName: sale.spaceName,
      timeZone: sale.time_zone,
      buyerName: sale.name,
      method: sale.method,
      currency: sale.currency.trim(),
      totalMinor: sale.total_minor,
      tax: {
        name: (await moneyRules(db, sale.space_id)).taxName,
        mode: sale.tax_mode,
        rateBp: sale.tax_rate_bp,
        taxMinor: sale.tax_minor,
      },
      paidAt: sale.paid_at,
      lines: lines.map((l) => ({
        name: l.name,
        qty: l.qty,
        unitPriceMinor: l.unit_price_minor,
        saleUnit: l.sale_unit,
      })),
    },
    env().APP_BASE_URL,
  );
  await sendMail({ to: sale.email, ...message });
}

/** Receipts after commit: a mail failure is logged, never turned into a failed payment. */
export async function sendReceipts(db: Db, saleIds: string[]): Promise<void> {
  for (const id of saleIds) {
    try {
      await sendSaleReceipt(db, id);
    } catch (err) {
      log.error({ saleId: id, err: err instanceof Error ? err.message : String(err) }, 'receipt not sent');
    }
  }
}
