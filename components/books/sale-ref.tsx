import Link from 'next/link';

/** A sale's short reference (first eight characters of its id), linking to its page in the books. */
export function SaleRef({ id }: { id: string | null }) {
  if (!id) return <>—</>;
  return (
    <Link href={`/books/sales/${id}`} className="font-mono">
      {id.slice(0, 8).toUpperCase()}
    </Link>
  );
}
