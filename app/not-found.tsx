// Plain links, not next/link: every page's first load carries the not-found boundary's JavaScript, and this
// page needs none (following a link from here loads the page afresh, which is what a dead end wants anyway).
export default function NotFound() {
  return (
    <main className="mx-auto max-w-lg px-4 py-16">
      <h1 className="text-2xl font-bold">Nothing here</h1>
      <p className="muted mt-2">
        That page or record does not exist in your space, or the label code is unknown.
      </p>
      <p className="mt-4 flex gap-3">
        <a href="/today">Today</a>
        <a href="/scan">Scan a label</a>
      </p>
    </main>
  );
}
