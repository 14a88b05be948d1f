'use client';
import { useRouter } from 'next/navigation';
import { callApi } from '@/components/ui/api';
import { useApiForm } from '@/components/shelf/use-api-form';
import { FormMessage } from '@/components/shelf/form-bits';

/** Starts a draft order list to one supplier from its to-order lines; the list opens to be adjusted. */
export function StartOrder({
  supplierId,
  supplierName,
  lines,
}: {
  supplierId: string;
  supplierName: string;
  lines: { partId: string; packs: number }[];
}) {
  const router = useRouter();
  const form = useApiForm();
  async function start() {
    const r = await form.run(
      () => callApi<{ order: { id: string } }>('/api/orders', 'POST', { supplierId, lines }),
      () => 'Order list started.',
    );
    if (r) router.push(`/orders/${r.order.id}`);
  }
  return (
    <div className="space-y-2">
      <FormMessage message={form.ok ? undefined : form.message} fields={form.fields} />
      <button type="button" className="btn-primary" onClick={start} disabled={form.busy} data-primary>
        {form.busy ? 'Starting…' : `Start an order list for ${supplierName}`}
      </button>
    </div>
  );
}
