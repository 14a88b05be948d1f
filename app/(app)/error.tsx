'use client';

export default function SectionError({ error, reset }: { error: Error & { digest?: string }; reset: () => void }) {
  return (
    <div role="alert" className="card mx-auto max-w-lg">
      <h1 className="text-xl font-bold">This page could not load</h1>
      <p className="muted mt-2">
        Something went wrong on our side{error.digest ? ` (reference ${error.digest})` : ''}. Your data is safe; try
        again.
      </p>
      <button className="btn-primary mt-4" onClick={reset}>
        Try again
      </button>
    </div>
  );
}
