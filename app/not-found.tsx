import Link from 'next/link';

export default function NotFound() {
  return (
    <main className="mx-auto max-w-lg px-4 py-16">
      <h1 className="text-2xl font-bold">Nothing here</h1>
      <p className="muted mt-2">That page or record does not exist in your space, or the label code is unknown.</p>
      <p className="mt-4 flex gap-3">
        <Link href="/today">Today</Link>
        <Link href="/scan">Scan a label</Link>
      </p>
    </main>
  );
}
