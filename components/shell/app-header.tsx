import Link from 'next/link';
import type { Ctx } from '@/lib/auth/roles';
import { phoneNavIcons } from './nav-icons';
import { navFor, phoneBar } from './nav-items';
import { PhoneNav } from './phone-nav';
import { SpaceSwitcher } from './space-switcher';
import { SignOutButton } from './sign-out-button';

/**
 * Header and section navigation; the sections shown depend on the person's roles in this space. From 640 px
 * the sections sit under the header (wrapping, never cut off); on a phone they are the bar at the bottom and
 * its "More" sheet (PhoneNav), and the header keeps one line: the name, the space, and on wider screens sign-out.
 */
export function AppHeader({ ctx }: { ctx: Ctx | null }) {
  const items = ctx ? navFor(ctx.roles) : [];
  return (
    <header className="no-print border-b border-stone-200 bg-white dark:border-stone-800 dark:bg-stone-900">
      <div className="mx-auto flex max-w-6xl flex-nowrap items-center justify-between gap-3 px-4 py-2">
        <Link
          href={ctx ? '/today' : '/'}
          className="shrink-0 text-lg font-bold whitespace-nowrap text-stone-900 no-underline dark:text-stone-100"
        >
          <span aria-hidden className="text-accent dark:text-teal-300">
            Ω
          </span>{' '}
          Ohmstead
        </Link>
        {ctx ? (
          <div className="flex min-w-0 items-center gap-3">
            <SpaceSwitcher spaces={ctx.spaces} current={ctx.spaceId} />
            <span className="hidden text-sm whitespace-nowrap md:inline" title={ctx.email}>
              {ctx.name}
            </span>
            <span className="hidden shrink-0 sm:inline">
              <SignOutButton />
            </span>
          </div>
        ) : (
          <Link href="/signin" className="btn-quiet">
            Sign in
          </Link>
        )}
      </div>
      {ctx ? (
        <nav aria-label="Sections" className="mx-auto hidden max-w-6xl px-2 sm:block">
          <ul className="flex flex-wrap gap-1 pb-1 text-sm font-semibold">
            {items.map((n) => (
              <li key={n.href}>
                <Link
                  href={n.href}
                  className="block rounded-md px-3 py-2 whitespace-nowrap text-stone-700 no-underline hover:bg-stone-100 dark:text-stone-200 dark:hover:bg-stone-800"
                >
                  {n.label}
                </Link>
              </li>
            ))}
          </ul>
        </nav>
      ) : null}
      {ctx ? (
        <PhoneNav items={items} bar={phoneBar(items)} name={ctx.name} icons={phoneNavIcons(items)} />
      ) : null}
    </header>
  );
}
