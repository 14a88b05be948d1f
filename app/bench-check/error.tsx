'use client';

// If the bench check itself fails to render, say so and keep what was typed: the form is saved in this
// tab's sessionStorage on every change and comes back on "Try again".
export default function BenchCheckError({ reset }: { error: Error & { digest?: string }; reset: () => void }) {
  return (
    <main className="mx-auto max-w-lg px-4 py-8">
      <div role="alert" className="card">
        <h1 className="text-xl font-bold">The bench check hit a problem</h1>
        <p className="mt-2">Everything you typed is kept in this tab. Try again; it comes back as you left it.</p>
        <button className="btn-primary mt-4" onClick={reset}>
          Try again
        </button>
      </div>
    </main>
  );
}
