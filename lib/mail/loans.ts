import { formatDateTime } from '@/lib/format';

// Loan mail in our own plain words: reminders (before due, on the day, overdue, a steward's nudge) and
// "your hold is ready". Builders only — the sweep and the services send them. No `server-only` here:
// the reminder sweep runs in the job worker and in integration tests, outside Next's server bundle.

export type MailLine = { name: string; qty: number; unitCode: string | null };
export type BuiltMail = { to: string; subject: string; text: string; html: string };

const esc = (s: string) => s.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);

function lineText(l: MailLine): string {
  return `${l.qty > 1 ? `${l.qty} × ` : ''}${l.name}${l.unitCode ? ` (label ${l.unitCode})` : ''}`;
}

export type ReminderKind = 'before_due' | 'due_day' | 'overdue' | 'manual';

export function reminderMail(r: {
  to: string;
  name: string;
  spaceName: string;
  kind: ReminderKind;
  dueAt: Date;
  timeZone: string;
  daysLate: number;
  boxName: string | null;
  lines: MailLine[];
  loanUrl: string;
}): BuiltMail {
  const due = formatDateTime(r.dueAt, r.timeZone);
  const what = r.boxName ?? (r.lines.length === 1 ? r.lines[0].name : `${r.lines.length} items`);
  const late = r.daysLate > 0;
  const subject = late
    ? `Overdue: ${what} (due ${due})`
    : r.kind === 'due_day'
      ? `Due today: ${what}`
      : `Due soon: ${what} (due ${due})`;
  const opening = late
    ? `${what} was due back at ${r.spaceName} on ${due}, ${r.daysLate} ${r.daysLate === 1 ? 'day' : 'days'} ago. Please bring it back to the bench, or tell a steward if something went wrong.`
    : r.kind === 'due_day'
      ? `${what} is due back at ${r.spaceName} today, by ${due}.`
      : `A friendly note: ${what} is due back at ${r.spaceName} on ${due}. If nobody is waiting for it, you can renew it once from your loan page.`;
  const text = [
    `Hello ${r.name},`,
    '',
    opening,
    '',
    'On this loan:',
    ...r.lines.map((l) => `- ${lineText(l)}`),
    '',
    `Your loan: ${r.loanUrl}`,
  ].join('\n');
  const html =
    `<p>Hello ${esc(r.name)},</p><p>${esc(opening)}</p><p>On this loan:</p><ul>` +
    r.lines.map((l) => `<li>${esc(lineText(l))}</li>`).join('') +
    `</ul><p><a href="${esc(r.loanUrl)}">Open your loan</a></p>`;
  return { to: r.to, subject, text, html };
}

export function holdReadyMail(h: {
  to: string;
  name: string;
  spaceName: string;
  itemName: string;
  url: string;
}): BuiltMail {
  const subject = `Ready for you: ${h.itemName}`;
  const body = `${h.itemName} is back at ${h.spaceName} and kept for you. Borrow it at the bench when you next come in; if you no longer need it, cancel the hold so the next person can have it.`;
  return {
    to: h.to,
    subject,
    text: `Hello ${h.name},\n\n${body}\n\n${h.url}\n`,
    html: `<p>Hello ${esc(h.name)},</p><p>${esc(body)}</p><p><a href="${esc(h.url)}">Open it</a></p>`,
  };
}
