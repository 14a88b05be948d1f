'use client';
import { useMutation } from '@tanstack/react-query';
import { callApi } from '@/components/ui/api';
import { ErrorNote } from '@/components/loans/error-note';

// Opens the processor's pay page for everything the person owes in charges and goes there; the page
// sends them back to this loan. The server fixes the amount (what is owed when the page opens).
export function PayChargesByCard({ personId, loanId, label }: { personId: string; loanId: string; label: string }) {
  const m = useMutation({
    mutationFn: () =>
      callApi<{ payment: { url: string } }>(`/api/people/${personId}/pay-charges`, 'POST', { loanId }),
    onSuccess: ({ payment }) => window.location.assign(payment.url),
  });
  return (
    <div className="space-y-1">
      <button type="button" className="btn-primary" disabled={m.isPending || m.isSuccess} onClick={() => m.mutate()}>
        {m.isPending || m.isSuccess ? 'Opening the pay page…' : label}
      </button>
      <ErrorNote error={m.error} small />
    </div>
  );
}
