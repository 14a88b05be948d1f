import { NextResponse } from 'next/server';
import { db } from '@/db';
import { requireRole } from '@/lib/auth/guard';
import { handle, parseJsonBody } from '@/lib/http/respond';
import { sendReceipts } from '@/lib/mail/sales';
import { recordCashSale } from '@/lib/sales/cash';
import { startSaleInput } from '@/lib/sales/schemas';

// POST: cash into the honour box, recorded by a steward; paid at once, stock out.
export const POST = handle(async (req: Request) => {
  const ctx = await requireRole('steward');
  const input = await parseJsonBody(req, startSaleInput);
  const sale = await recordCashSale(db, ctx, input);
  await sendReceipts(db, [sale.saleId]);
  return NextResponse.json(
    { sale: { id: sale.saleId, status: 'paid', totalMinor: sale.totalMinor, currency: sale.currency } },
    { status: 201 },
  );
});
