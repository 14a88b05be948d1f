import { notFound } from 'next/navigation';
import { z } from 'zod';
import { requirePageUser } from '@/lib/auth/guard';
import { SaleStatus } from '@/components/counter/sale-status';
import { PageTitle } from '@/components/ui/page-title';

export const metadata = { title: 'Payment' };

// The processor's page returns here (?sale=…, and &cancelled=1 from its Cancel button).
export default async function CounterDonePage({
  searchParams,
}: {
  searchParams: Promise<{ sale?: string; cancelled?: string }>;
}) {
  const ctx = await requirePageUser();
  const { sale, cancelled } = await searchParams;
  if (!z.uuid().safeParse(sale).success) notFound();
  return (
    <>
      <PageTitle title="Your payment" />
      <SaleStatus saleId={sale!} cancelled={cancelled === '1'} me={ctx.userId} />
    </>
  );
}
