/**
 * A wide table's sideways scroller. It takes keyboard focus, so people who cannot use a mouse or a
 * swipe can still scroll it (WCAG 2.1.1), and it is named for screen readers.
 */
export function ScrollRegion({ label, children }: { label: string; children: React.ReactNode }) {
  return (
    <div className="overflow-x-auto focus-visible:outline-2" tabIndex={0} role="region" aria-label={label}>
      {children}
    </div>
  );
}
