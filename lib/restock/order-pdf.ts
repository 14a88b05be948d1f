import { PDFDocument, StandardFonts, type PDFFont, type PDFPage } from 'pdf-lib';
import { drawable } from '@/labels/text-fit';
import { formatQty } from '@/lib/inventory/measure';
import { formatDate } from '@/lib/format';
import { formatMoney } from '@/lib/money';
import { ORDER_STATE_WORDS } from './order-words';
import type { OrderDetail } from './orders';

// The printable order list: A4 portrait (595 × 842 pt), our own plain layout — who orders from whom, one
// row per line (their reference, description, packs × pack size, price per pack, line total), the total.
// pdf-lib's standard fonts draw WinAnsi only, so every text goes through `drawable` first.

const A4 = { w: 595, h: 842 };
const MARGIN = 48;

function fit(font: PDFFont, size: number, text: string, width: number): string {
  let t = drawable(font, text);
  if (font.widthOfTextAtSize(t, size) <= width) return t;
  while (t.length > 1 && font.widthOfTextAtSize(`${t}...`, size) > width) t = t.slice(0, -1);
  return `${t.trimEnd()}...`;
}

export async function orderPdf(order: OrderDetail, spaceName: string, timeZone: string): Promise<Uint8Array> {
  const doc = await PDFDocument.create();
  doc.setTitle(`Order list to ${order.supplier.name}`);
  const text = await doc.embedFont(StandardFonts.Helvetica);
  const bold = await doc.embedFont(StandardFonts.HelveticaBold);
  const money = (n: number) => formatMoney(n, order.currency);
  let page: PDFPage = doc.addPage([A4.w, A4.h]);
  let y = A4.h - MARGIN;
  const write = (s: string, x: number, size = 10, font = text, width = A4.w - MARGIN - x) =>
    page.drawText(fit(font, size, s, width), { x, y, size, font });
  const right = (s: string, xRight: number, size = 10, font = text) => {
    const t = drawable(font, s);
    page.drawText(t, { x: xRight - font.widthOfTextAtSize(t, size), y, size, font });
  };

  write(`Order list to ${order.supplier.name}`, MARGIN, 16, bold);
  y -= 22;
  write(`From ${spaceName} · ${ORDER_STATE_WORDS[order.state]}`, MARGIN, 10);
  y -= 14;
  write(
    [
      order.sentAt ? `Sent ${formatDate(order.sentAt, timeZone)}` : `Started ${formatDate(order.createdAt, timeZone)}`,
      order.expectedAt ? `expected by ${formatDate(order.expectedAt, timeZone)}` : '',
      order.supplier.email,
    ]
      .filter(Boolean)
      .join(' · '),
    MARGIN,
  );
  y -= 14;
  write(`Reference ${order.id.slice(0, 8).toUpperCase()} · amounts in ${order.currency}`, MARGIN);
  y -= 26;

  const cols = { ref: MARGIN, desc: MARGIN + 80, qty: 400, price: 480, total: A4.w - MARGIN };
  const header = () => {
    write('Their ref.', cols.ref, 9, bold, 76);
    write('Description', cols.desc, 9, bold, 230);
    right('Packs × size', cols.qty + 20, 9, bold);
    right('Per pack', cols.price + 20, 9, bold);
    right('Line total', cols.total, 9, bold);
    y -= 16;
  };
  header();
  for (const l of order.lines) {
    if (y < MARGIN + 40) {
      page = doc.addPage([A4.w, A4.h]);
      y = A4.h - MARGIN;
      header();
    }
    write(l.itemRef || '-', cols.ref, 9, text, 76);
    write(l.partName, cols.desc, 9, text, 230);
    right(`${l.packs} × ${formatQty(l.packSize, l.saleUnit)}`, cols.qty + 20, 9);
    right(money(l.packPriceMinor), cols.price + 20, 9);
    right(money(l.lineTotalMinor), cols.total, 9);
    y -= 14;
  }
  y -= 8;
  right(`Total ${money(order.totalMinor)}`, cols.total, 11, bold);
  if (order.note) {
    y -= 22;
    write(`Note: ${order.note}`, MARGIN, 10);
  }
  return doc.save();
}
