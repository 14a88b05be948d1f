'use client';

export default function GlobalError({ reset }: { error: Error; reset: () => void }) {
  return (
    <html lang="en">
      <body style={{ fontFamily: 'Karla, sans-serif', padding: 24 }}>
        <h1>Ohmstead hit a problem</h1>
        <p>Try again; if it keeps happening, tell a steward.</p>
        <button onClick={reset}>Try again</button>
      </body>
    </html>
  );
}
