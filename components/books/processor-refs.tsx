import { CopyText } from './copy-text';

/** The processor's own identifiers for a row, one tap away (for finding it on their side). */
export function ProcessorRefs({
  paymentRef,
  ledgerRef,
}: {
  paymentRef: string | null;
  ledgerRef: string | null;
}) {
  if (!paymentRef && !ledgerRef) return <span className="muted">—</span>;
  return (
    <details className="max-w-64 text-sm">
      <summary className="cursor-pointer whitespace-nowrap">Processor’s refs</summary>
      <dl className="mt-1 space-y-1">
        {paymentRef ? (
          <div>
            <dt className="muted text-xs">Their payment or refund</dt>
            <dd>
              <CopyText label="the processor’s payment reference" value={paymentRef} />
            </dd>
          </div>
        ) : null}
        {ledgerRef ? (
          <div>
            <dt className="muted text-xs">Their ledger entry</dt>
            <dd>
              <CopyText label="the processor’s ledger reference" value={ledgerRef} />
            </dd>
          </div>
        ) : null}
      </dl>
    </details>
  );
}
