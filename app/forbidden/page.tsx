import Link from 'next/link';

export const metadata = { title: 'Not for your role' };

export default function Forbidden() {
  return (
    <main className="mx-auto max-w-lg px-4 py-16">
      <h1 className="text-2xl font-bold">Not for your role</h1>
      <p className="muted mt-2">Your role in this space does not open this page. An admin can change roles under People.</p>
      <p className="mt-4">
        <Link href="/today">Back to Today</Link>
      </p>
    </main>
  );
}
