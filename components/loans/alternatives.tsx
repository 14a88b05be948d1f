import type { Alternative } from '@/lib/loans/alternatives';
import { VerdictBadge } from '@/components/ui/verdict-badge';
import { displayCode } from '@/labels/code';

// "What works with this": supplies and drivers in this space that pass with the same LEDs.
export function Alternatives({ items }: { items: Alternative[] }) {
  return (
    <section aria-labelledby="alternatives-heading" className="card">
      <h2 id="alternatives-heading" className="text-lg font-bold">
        What works with these LEDs
      </h2>
      {items.length === 0 ? (
        <p className="muted mt-2">
          Nothing free on the shelf passes with these LEDs. Ask a steward about another kit.
        </p>
      ) : (
        <ol className="mt-2 space-y-3">
          {items.map((a) => (
            <li
              key={`${a.supply.partId}:${a.driver.partId}`}
              className="rounded-lg border border-stone-200 p-3 dark:border-stone-700"
            >
              <VerdictBadge verdict={a.verdict} />
              <p className="mt-1">
                <span className="muted">Supply:</span> {a.supply.name} <Where part={a.supply} />
              </p>
              <p>
                <span className="muted">Driver:</span> {a.driver.name} <Where part={a.driver} />
              </p>
            </li>
          ))}
        </ol>
      )}
    </section>
  );
}

function Where({ part }: { part: Alternative['supply'] }) {
  if (part.inSelection) return <span className="text-sm">(the one you have)</span>;
  return (
    <span className="text-sm">
      ({part.free} free{part.code ? `, e.g. label ${displayCode(part.code)}` : ''})
    </span>
  );
}
