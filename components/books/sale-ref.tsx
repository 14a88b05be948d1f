import Link from 'next/link';
import { saleRef } from '@/lib/sales/ref';

/** A sale's short reference (lib/sales/ref.ts), linking to its page in the books. */
export function SaleRef({ id }: { id: string | null }) {
  if (!id) return <>—</>;
  return (
    <Link href={`/books/sales/${id}`} className="font-mono whitespace-nowrap">
      {saleRef(id)}
    </Link>
  );
}
