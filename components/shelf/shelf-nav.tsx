'use client';
import Link from 'next/link';
import { usePathname } from 'next/navigation';

const ITEMS = [
  { href: '/shelf', label: 'Parts', staff: false },
  { href: '/shelf/receive', label: 'Receive', staff: true },
  { href: '/shelf/move', label: 'Move', staff: true },
  { href: '/shelf/counts', label: 'Counts', staff: true },
  { href: '/shelf/locations', label: 'Locations', staff: false },
  { href: '/shelf/repairs', label: 'Repairs', staff: false },
  { href: '/shelf/labels', label: 'Labels', staff: true },
  { href: '/shelf/import', label: 'Import', staff: true },
];

/** The shelf's own sections; members see the reading ones. */
export function ShelfNav({ staff }: { staff: boolean }) {
  const path = usePathname();
  const current = (href: string) =>
    href === '/shelf' ? path === '/shelf' || path.startsWith('/shelf/parts') : path.startsWith(href);
  // Wraps onto a second line on a phone rather than hiding tabs off the edge.
  return (
    <nav aria-label="Shelf" className="no-print mb-4">
      <ul className="flex flex-wrap gap-x-1 border-b border-stone-200 text-sm dark:border-stone-800">
        {ITEMS.filter((i) => staff || !i.staff).map((i) => (
          <li key={i.href}>
            <Link
              href={i.href}
              aria-current={current(i.href) ? 'page' : undefined}
              className="block border-b-2 border-transparent px-3 py-2 whitespace-nowrap text-stone-700 no-underline hover:text-stone-950 aria-[current=page]:border-accent aria-[current=page]:font-bold aria-[current=page]:text-stone-950 dark:text-stone-300 dark:hover:text-white dark:aria-[current=page]:text-white"
            >
              {i.label}
            </Link>
          </li>
        ))}
      </ul>
    </nav>
  );
}
