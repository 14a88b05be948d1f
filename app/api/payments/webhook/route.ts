import { after, NextResponse } from 'next/server';
import Stripe from 'stripe';
import { db } from '@/db';
import { InvalidError } from '@/lib/errors';
import { handle } from '@/lib/http/respond';
import { paymentsClient, webhookSecret } from '@/lib/payments/client';
import { applyPaymentEvent } from '@/lib/payments/events';
import { syncRefunds } from '@/lib/payments/refund-sync';
import { sendReceipts } from '@/lib/mail/sales';

export const dynamic = 'force-dynamic';

// The processor's webhook. Public (the signature is the authentication): the raw body is verified
// against the signing secret before anything is read from it, and a bad or stale signature (older
// than the SDK's 5-minute tolerance) is a 400 with nothing applied. A verified event is applied once,
// in one transaction (lib/payments/events.ts); receipts and refund fetches run after the answer.
export const POST = handle(async (req: Request) => {
  const raw = await req.text();
  const header = req.headers.get('stripe-signature');
  if (!header)
    throw new InvalidError('Missing the Stripe-Signature header.', { 'stripe-signature': ['required'] });
  let event: Stripe.Event;
  try {
    event = Stripe.webhooks.constructEvent(raw, header, webhookSecret());
  } catch (err) {
    const why = err instanceof Error ? err.message : 'signature check failed';
    throw new InvalidError('The webhook signature does not verify.', {
      'stripe-signature': [why.split('\n')[0].slice(0, 200)],
    });
  }
  const result = await applyPaymentEvent(db, event);
  // After the answer: the processor waits only a few seconds for it, and mail can be slower.
  after(async () => {
    await sendReceipts(db, result.receipts);
    for (const saleId of result.refundsToSync) {
      const sale = await db
        .selectFrom('sales')
        .select('space_id')
        .where('id', '=', saleId)
        .executeTakeFirst();
      try {
        if (sale) await syncRefunds(db, paymentsClient(sale.space_id), saleId);
      } catch (err) {
        console.error(
          `[webhook] refund sync for sale ${saleId}: ${err instanceof Error ? err.message : String(err)}`,
        );
      }
    }
  });
  return NextResponse.json({ received: true, id: event.id, outcome: result.outcome });
});
