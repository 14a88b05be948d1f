export default function Loading() {
  return (
    <div role="status" aria-live="polite" className="muted py-10 text-center">
      Loading…
    </div>
  );
}
