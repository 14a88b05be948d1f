import type { StoredMessage } from '../../lib/mail/message';

// The dev mailbox as plain HTML, served by the sink itself (on 127.0.0.1 only), so the demo's mail is
// readable without any page in the app's own build. Every piece of a message is escaped; links are
// made clickable only when they point at http(s) addresses, and open with no referrer.

const escape = (s: string) =>
  s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);

/** Escapes the text, then turns bare http(s) URLs into links. */
export function linkify(text: string): string {
  return escape(text).replace(
    /https?:\/\/[^\s<>"']+/g,
    (url) => `<a href="${url}" rel="noreferrer noopener">${url}</a>`,
  );
}

const STYLE = `
:root { color-scheme: light dark; --bg: #f7f7f5; --fg: #1c1c1a; --muted: #5b5b57; --line: #d8d8d2; --accent: #0f766e; }
@media (prefers-color-scheme: dark) { :root { --bg: #161615; --fg: #ededea; --muted: #b3b3ad; --line: #3a3a37; --accent: #5eead4; } }
* { box-sizing: border-box; }
body { margin: 0; font: 16px/1.5 system-ui, sans-serif; background: var(--bg); color: var(--fg); }
main { max-width: 48rem; margin: 0 auto; padding: 1rem; }
h1 { font-size: 1.3rem; margin: 0 0 .25rem; }
p.note { color: var(--muted); margin: 0 0 1rem; font-size: .9rem; }
ol { list-style: none; margin: 0; padding: 0; }
li { border-top: 1px solid var(--line); }
li a { display: block; padding: .75rem .25rem; color: inherit; text-decoration: none; min-height: 44px; }
li a:hover, li a:focus { background: color-mix(in srgb, var(--accent) 12%, transparent); }
.subject { font-weight: 600; overflow-wrap: anywhere; }
.meta { color: var(--muted); font-size: .85rem; overflow-wrap: anywhere; }
pre { white-space: pre-wrap; overflow-wrap: anywhere; font: inherit; border-top: 1px solid var(--line); padding-top: 1rem; }
a { color: var(--accent); }
`;

function page(title: string, body: string): string {
  return `<!doctype html><html lang="en"><head><meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<title>${escape(title)}</title><style>${STYLE}</style></head><body><main>${body}</main></body></html>`;
}

export function mailboxListPage(messages: StoredMessage[]): string {
  const rows = messages
    .map(
      (m) => `<li><a href="/view/${encodeURIComponent(m.id)}"><div class="subject">${escape(m.subject || '(no subject)')}</div>
<div class="meta">to ${escape(m.to.join(', '))} · ${escape(m.receivedAt)}</div></a></li>`,
    )
    .join('');
  return page(
    'Dev mailbox',
    `<h1>Dev mailbox</h1><p class="note">Every e-mail the local Ohmstead sent, newest first. Nothing here left this
machine. ${messages.length} message(s).</p>${rows ? `<ol>${rows}</ol>` : '<p>No mail yet.</p>'}`,
  );
}

export function mailboxMessagePage(m: StoredMessage): string {
  return page(
    m.subject || 'Message',
    `<p><a href="/">← All mail</a></p><h1>${escape(m.subject || '(no subject)')}</h1>
<p class="meta">from ${escape(m.from)}<br>to ${escape(m.to.join(', '))}<br>${escape(m.receivedAt)}</p>
<pre>${linkify(m.text)}</pre>${(m.attachments ?? [])
      .map((a) => `<h2>Attached: ${escape(a.filename)} (${escape(a.contentType)}, ${a.size} bytes)</h2>${a.text !== null ? `<pre>${escape(a.text)}</pre>` : ''}`)
      .join('')}`,
  );
}
