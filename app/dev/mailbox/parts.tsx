// Small pieces shared by the dev mailbox pages.

/** Shown when the local SMTP sink does not answer. */
export function SinkDown({ detail }: { detail: string }) {
  return (
    <div role="alert" className="card border-verdict-caution/50">
      <p className="font-semibold">The local mail sink is not answering.</p>
      <p className="muted mt-1 text-sm">{detail}</p>
      <p className="mt-2 text-sm">
        Start it with <code>npx tsx fakes/smtp/main.ts</code> (or <code>npm start</code>), then reload this
        page.
      </p>
    </div>
  );
}

export function formatReceived(iso: string): string {
  return new Date(iso).toLocaleString('en-GB', { dateStyle: 'medium', timeStyle: 'medium' });
}

/** A search parameter may arrive repeated; the first non-blank value wins. */
export function firstParam(raw: string | string[] | undefined): string | undefined {
  return (Array.isArray(raw) ? raw[0] : raw)?.trim() || undefined;
}

/** The list keeps its recipient filter when a message is opened and closed again. */
export function messageHref(id: string, to?: string): string {
  return `/dev/mailbox/${encodeURIComponent(id)}${to ? `?to=${encodeURIComponent(to)}` : ''}`;
}

export function listHref(to?: string): string {
  return to ? `/dev/mailbox?to=${encodeURIComponent(to)}` : '/dev/mailbox';
}
