import Link from 'next/link';
import type { OutOfServiceBox } from '@/lib/kits/upkeep';
import { formatDateTime } from '@/lib/format';
import { CodeText } from '@/components/shelf/code-text';

const CONDITION_WORDS: Record<string, string> = { missing: 'missing', damaged: 'damaged' };

/** Kit boxes out of service, each with what it lacks against its kit list and what its last return said. */
export function OutOfServiceList({ boxes, timeZone }: { boxes: OutOfServiceBox[]; timeZone: string }) {
  return (
    <ul className="space-y-3" aria-label="Kit boxes out of service">
      {boxes.map((b) => (
        <li key={b.id} className="rounded-lg border border-amber-700 p-3">
          <div className="flex flex-wrap items-baseline justify-between gap-2">
            <Link href={`/kits/boxes/${b.id}`} className="font-bold">
              {b.name}
            </Link>
            <span className="text-sm">
              <CodeText code={b.code} />
            </span>
          </div>
          {b.shortfall.length ? (
            <p className="mt-1">
              Lacks{' '}
              {b.shortfall.map((s, i) => (
                <span key={s.partId}>
                  {i ? ', ' : ''}
                  {s.missing} × {s.name}
                </span>
              ))}
              .
            </p>
          ) : (
            <p className="mt-1">Complete against its kit list; put it back in service by refilling.</p>
          )}
          {b.lastReturn ? (
            <p className="muted mt-1 text-sm">
              Returned {formatDateTime(b.lastReturn.at, timeZone)}
              {b.lastReturn.lines.length
                ? `: ${b.lastReturn.lines.map((l) => `${l.qty} × ${l.part} ${CONDITION_WORDS[l.condition] ?? l.condition}`).join(', ')}`
                : ''}
              {b.lastReturn.note ? ` — “${b.lastReturn.note}”` : ''}
            </p>
          ) : null}
        </li>
      ))}
    </ul>
  );
}
