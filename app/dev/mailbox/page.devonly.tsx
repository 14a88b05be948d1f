import type { Metadata } from 'next';
import Link from 'next/link';
import { PageTitle } from '@/components/ui/page-title';
import { listMessages } from '@/lib/mail/server';
import { readMailbox, requireDevMailbox } from './gate';
import { firstParam, formatReceived, messageHref, SinkDown } from './parts';

export const metadata: Metadata = { title: 'Dev mailbox', robots: { index: false, follow: false } };

type Props = { searchParams: Promise<{ to?: string | string[] }> };

// Every message the local SMTP sink caught, newest first, so sign-in and payment links can be followed
// without a real mail account. Development and demo only.
export default async function DevMailboxPage({ searchParams }: Props) {
  await requireDevMailbox();
  const to = firstParam((await searchParams).to);
  const result = await readMailbox(() => listMessages({ to }));

  return (
    <main className="mx-auto w-full max-w-3xl px-4 py-6">
      <PageTitle
        title="Dev mailbox"
        lead="Mail this installation sends lands here instead of real inboxes. Not available in production."
      />

      <form method="get" className="mb-4 flex flex-wrap items-end gap-2" role="search">
        <label className="min-w-0 flex-1">
          <span className="label">Recipient</span>
          <input
            type="email"
            name="to"
            defaultValue={to ?? ''}
            placeholder="someone@example.test"
            className="field"
          />
        </label>
        <button type="submit" className="btn-primary">
          Filter
        </button>
        {to && (
          <Link href="/dev/mailbox" className="btn-quiet">
            Show all
          </Link>
        )}
      </form>

      {'down' in result ? (
        <SinkDown detail={result.down} />
      ) : result.data.length === 0 ? (
        <p className="card muted text-center">{to ? `Nothing for ${to} yet.` : 'No mail yet.'}</p>
      ) : (
        <ul className="card divide-y divide-stone-200 p-0 dark:divide-stone-800">
          {result.data.map((m) => (
            <li key={m.id}>
              <Link
                href={messageHref(m.id, to)}
                className="block px-4 py-3 text-inherit hover:bg-accent-soft/40 hover:no-underline dark:text-inherit dark:hover:bg-white/5"
              >
                <span className="block truncate font-semibold">{m.subject || '(no subject)'}</span>
                <span className="muted mt-0.5 flex flex-wrap justify-between gap-x-4 text-sm">
                  <span className="min-w-0 truncate">to {m.to.join(', ')}</span>
                  <time dateTime={m.receivedAt}>{formatReceived(m.receivedAt)}</time>
                </span>
              </Link>
            </li>
          ))}
        </ul>
      )}
    </main>
  );
}
