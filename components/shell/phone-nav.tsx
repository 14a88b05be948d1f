'use client';
import Link from 'next/link';
import { usePathname } from 'next/navigation';
import { useEffect, useRef, useState } from 'react';
import type { PhoneNavIcons } from './nav-icons';
import type { NavItem } from './nav-items';
import { SignOutButton } from './sign-out-button';

const isHere = (pathname: string, href: string) => pathname === href || pathname.startsWith(`${href}/`);

/**
 * The phone's navigation (below 640 px): a bar at the bottom, within a thumb's reach, with the four sections
 * used most, and "More", which opens every section of this person (and signing out) as a sheet. The sheet
 * is a modal <dialog>: focus moves into it, Escape closes it, and focus returns to "More".
 */
export function PhoneNav({
  items,
  bar,
  name,
  icons,
}: {
  items: NavItem[];
  bar: NavItem[];
  name: string;
  /** Drawn on the server (nav-icons.tsx), so the icon library is not in this component's JavaScript. */
  icons: PhoneNavIcons;
}) {
  const pathname = usePathname();
  const [open, setOpen] = useState(false);
  const sheet = useRef<HTMLDialogElement>(null);
  const more = useRef<HTMLButtonElement>(null);

  useEffect(() => {
    const d = sheet.current;
    if (!d) return;
    if (open && !d.open) d.showModal();
    if (!open && d.open) d.close();
  }, [open]);

  // Following a link closes the sheet (the layout stays mounted across pages).
  const [shownFor, setShownFor] = useState(pathname);
  if (shownFor !== pathname) {
    setShownFor(pathname);
    setOpen(false);
  }

  const moreIsHere =
    !bar.some((n) => isHere(pathname, n.href)) && items.some((n) => isHere(pathname, n.href));
  return (
    <>
      <nav
        aria-label="Main sections"
        className="no-print fixed inset-x-0 bottom-0 z-40 border-t border-stone-200 bg-white pb-[env(safe-area-inset-bottom)] sm:hidden dark:border-stone-800 dark:bg-stone-900"
      >
        <ul className="grid grid-cols-5">
          {bar.map((n) => {
            const here = isHere(pathname, n.href);
            return (
              <li key={n.href}>
                <Link
                  href={n.href}
                  aria-current={here ? 'page' : undefined}
                  className={`flex min-h-14 flex-col items-center justify-center gap-0.5 px-1 text-xs font-semibold no-underline ${
                    here ? 'text-accent dark:text-teal-300' : 'text-stone-700 dark:text-stone-200'
                  }`}
                >
                  {icons.sections[n.href]}
                  {n.label}
                </Link>
              </li>
            );
          })}
          <li>
            <button
              ref={more}
              type="button"
              aria-haspopup="dialog"
              aria-expanded={open}
              aria-controls="all-sections"
              onClick={() => setOpen(true)}
              className={`flex min-h-14 w-full flex-col items-center justify-center gap-0.5 px-1 text-xs font-semibold ${
                moreIsHere ? 'text-accent dark:text-teal-300' : 'text-stone-700 dark:text-stone-200'
              }`}
            >
              {icons.more}
              More
            </button>
          </li>
        </ul>
      </nav>
      <dialog
        ref={sheet}
        id="all-sections"
        aria-labelledby="all-sections-title"
        onClose={() => {
          setOpen(false);
          more.current?.focus();
        }}
        onClick={(e) => {
          // A tap on the backdrop (the dialog element itself, outside the sheet) closes it.
          if (e.target === e.currentTarget) setOpen(false);
        }}
        className="no-print m-0 mt-auto max-h-[85dvh] w-full max-w-none rounded-t-2xl border-t border-stone-200 bg-white p-0 text-stone-900 backdrop:bg-stone-950/50 sm:hidden dark:border-stone-700 dark:bg-stone-900 dark:text-stone-100"
      >
        <div className="p-4 pb-[calc(1rem+env(safe-area-inset-bottom))]">
          <div className="mb-3 flex items-center justify-between gap-3">
            <h2 id="all-sections-title" className="text-lg font-bold">
              All sections
            </h2>
            <button type="button" className="btn-quiet min-h-11 px-3" onClick={() => setOpen(false)}>
              {icons.close}
              Close
            </button>
          </div>
          <nav aria-label="All sections">
            <ul className="grid grid-cols-2 gap-2">
              {items.map((n) => {
                const here = isHere(pathname, n.href);
                return (
                  <li key={n.href}>
                    <Link
                      href={n.href}
                      aria-current={here ? 'page' : undefined}
                      onClick={() => setOpen(false)}
                      className={`flex min-h-12 items-center gap-2 rounded-lg border px-3 font-semibold no-underline ${
                        here
                          ? 'border-accent text-accent dark:border-teal-300 dark:text-teal-300'
                          : 'border-stone-200 text-stone-800 dark:border-stone-700 dark:text-stone-100'
                      }`}
                    >
                      {icons.sections[n.href]}
                      {n.label}
                    </Link>
                  </li>
                );
              })}
            </ul>
          </nav>
          <div className="mt-4 flex items-center justify-between gap-3 border-t border-stone-200 pt-3 dark:border-stone-700">
            <span className="muted min-w-0 truncate text-sm">Signed in as {name}</span>
            <SignOutButton />
          </div>
        </div>
      </dialog>
    </>
  );
}
