import { ShieldAlert } from 'lucide-react';
import type { Caution } from '@/lib/electrical';

// Safety notes beside every check and kit: calm, specific, and deferring to local codes and licensed
// electricians for anything on a building's wiring.
export function Cautions({ cautions, kitNotes }: { cautions: Caution[]; kitNotes?: string }) {
  if (!cautions.length && !kitNotes) return null;
  return (
    <section aria-labelledby="cautions-heading" className="card border-amber-300 dark:border-amber-800">
      <h2 id="cautions-heading" className="flex items-center gap-2 text-lg font-bold">
        <ShieldAlert aria-hidden className="size-5 text-amber-700 dark:text-amber-300" /> Safety
      </h2>
      {kitNotes ? <p className="mt-2">{kitNotes}</p> : null}
      <ul className="mt-2 ml-5 list-disc space-y-1">
        {cautions.map((c) => (
          <li key={c.id}>{c.text}</li>
        ))}
      </ul>
    </section>
  );
}
