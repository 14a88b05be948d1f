import type { Metadata } from 'next';
import Link from 'next/link';
import { notFound } from 'next/navigation';
import { extractLinks, getMessage } from '@/lib/mail/server';
import { readMailbox, requireDevMailbox } from '../gate';
import { firstParam, formatReceived, listHref, SinkDown } from '../parts';

export const metadata: Metadata = {
  title: 'Message · Dev mailbox',
  robots: { index: false, follow: false },
};

type Props = { params: Promise<{ id: string }>; searchParams: Promise<{ to?: string | string[] }> };

// The message's HTML runs in a sandboxed frame: no scripts, no same-origin access, no forms. Its links
// open in the top window (only after a click) so a sign-in link signs in here, not inside the frame.
const FRAME_SANDBOX = 'allow-popups allow-popups-to-escape-sandbox allow-top-navigation-by-user-activation';
const FRAME_HEAD =
  '<meta charset="utf-8"><base target="_top">' +
  `<meta http-equiv="Content-Security-Policy" content="default-src 'none'; img-src data: http: https:; style-src 'unsafe-inline'; font-src data:">`;

function frameDocument(html: string): string {
  return /<head[^>]*>/i.test(html)
    ? html.replace(/<head[^>]*>/i, (head) => head + FRAME_HEAD)
    : FRAME_HEAD + html;
}

export default async function DevMailboxMessagePage({ params, searchParams }: Props) {
  await requireDevMailbox();
  const { id } = await params;
  const back = listHref(firstParam((await searchParams).to));
  const result = await readMailbox(() => getMessage(id));

  if ('down' in result) {
    return (
      <main className="mx-auto w-full max-w-3xl px-4 py-6">
        <SinkDown detail={result.down} />
      </main>
    );
  }
  const message = result.data;
  if (!message) notFound();
  const links = extractLinks(message);

  return (
    <main className="mx-auto w-full max-w-3xl px-4 py-6">
      <Link href={back} className="inline-block min-h-11 content-center text-sm underline">
        ← All messages
      </Link>
      <h1 className="mt-2 text-2xl font-bold break-words">{message.subject || '(no subject)'}</h1>
      <dl className="mt-3 grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 text-sm">
        <dt className="muted">From</dt>
        <dd className="break-all">{message.from}</dd>
        <dt className="muted">To</dt>
        <dd className="break-all">{message.to.join(', ')}</dd>
        <dt className="muted">Received</dt>
        <dd>
          <time dateTime={message.receivedAt}>{formatReceived(message.receivedAt)}</time>
        </dd>
      </dl>

      {links.length > 0 && (
        <section className="mt-5" aria-labelledby="links-heading">
          <h2 id="links-heading" className="font-semibold">
            Links in this message
          </h2>
          <ul className="mt-2 space-y-2">
            {links.map((href) => (
              <li key={href}>
                <a
                  href={href}
                  rel="noreferrer"
                  className="card block px-3 py-2.5 text-sm break-all underline"
                >
                  {href}
                </a>
              </li>
            ))}
          </ul>
        </section>
      )}

      {message.html && (
        <section className="mt-5" aria-labelledby="html-heading">
          <h2 id="html-heading" className="font-semibold">
            As the recipient sees it
          </h2>
          <iframe
            title={`Message: ${message.subject}`}
            sandbox={FRAME_SANDBOX}
            referrerPolicy="no-referrer"
            srcDoc={frameDocument(message.html)}
            className="mt-2 h-[28rem] w-full rounded-lg border border-stone-200 bg-white dark:border-stone-800"
          />
        </section>
      )}

      <details className="mt-5" open={!message.html}>
        <summary className="min-h-11 cursor-pointer content-center font-semibold">Plain text</summary>
        <pre className="mt-2 overflow-x-auto rounded-lg bg-stone-100 p-3 text-sm whitespace-pre-wrap break-words dark:bg-stone-900">
          {message.text || '(no plain-text part)'}
        </pre>
      </details>

      {message.attachments?.length ? (
        <section className="mt-5" aria-labelledby="files-heading">
          <h2 id="files-heading" className="font-semibold">
            Attached files
          </h2>
          {message.attachments.map((a, i) => (
            <details key={`${a.filename}-${i}`} className="mt-2" open>
              <summary className="min-h-11 cursor-pointer content-center break-all">
                {a.filename} <span className="muted text-sm">({a.contentType}, {a.size} bytes)</span>
              </summary>
              {a.text !== null ? (
                <pre className="mt-2 overflow-x-auto rounded-lg bg-stone-100 p-3 text-sm whitespace-pre-wrap break-words dark:bg-stone-900">
                  {a.text}
                </pre>
              ) : null}
            </details>
          ))}
        </section>
      ) : null}

      {message.messageId && <p className="mt-4 muted text-xs break-all">Message-ID: {message.messageId}</p>}
    </main>
  );
}
