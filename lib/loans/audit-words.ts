import { formatDateTime } from '@/lib/format';

// One line of the loans audit trail in plain words: what it was about (the box, the parts), whom it
// concerns, and any date in the space's own time zone. Pure, so it is unit-tested; the page passes rows
// with `thing` and `person` already looked up.

type Row = { action: string; detail: Record<string, unknown>; thing?: string | null; person?: string | null };

const REMINDER_KIND: Record<string, string> = {
  before_due: 'before the due date',
  due_day: 'on the due day',
  overdue: 'overdue',
  manual: 'sent by hand',
};

const text = (v: unknown) => (v === undefined || v === null ? '' : String(v));
const validDate = (v: unknown) => {
  if (typeof v !== 'string' && !(v instanceof Date)) return null;
  const d = new Date(v);
  return Number.isNaN(d.getTime()) ? null : d;
};

export function auditLine(row: Row, timeZone: string): string {
  const d = row.detail ?? {};
  const thing = row.thing || text(d.box) || text(d.item) || text(d.name) || 'a loan';
  const person = row.person ? ` ${row.person}` : '';
  const when = (v: unknown) => {
    const at = validDate(v);
    return at ? formatDateTime(at, timeZone) : '';
  };
  const join = (...bits: string[]) => bits.filter(Boolean).join(' · ');
  switch (row.action) {
    case 'loan.created': {
      const due = when(d.dueAt);
      return join(
        `${thing}${person ? ` to${person}` : ''}`,
        text(d.verdict) && `check ${text(d.verdict)}`,
        d.cautionAcknowledged ? 'cautions acknowledged' : '',
        d.onBehalf ? 'lent by a steward' : '',
        due && `due ${due}`,
      );
    }
    case 'loan.override':
      return join(`${thing}${person ? ` for${person}` : ''}`, `“${text(d.reason)}”`);
    case 'loan.returned': {
      const lines = Array.isArray(d.lines)
        ? (d.lines as { part?: string; qty?: number; returned?: number; condition?: string }[])
        : [];
      const short = lines
        .filter((l) => l.condition && l.condition !== 'ok')
        .map((l) => `${(l.qty ?? 0) - (l.returned ?? 0)} × ${l.part ?? 'part'} ${l.condition}`);
      return join(
        `${thing}${person ? ` from${person}` : ''}`,
        d.status === 'returned_short' ? 'back short' : 'back complete',
        short.join(', '),
        text(d.note) && `note “${text(d.note)}”`,
      );
    }
    case 'loan.renewed': {
      const due = when(d.to);
      return join(`${thing}${person ? ` for${person}` : ''}`, due && `now due ${due}`);
    }
    case 'reminder.sent':
    case 'reminder.failed':
      return join(
        `${thing}${person ? ` for${person}` : ''}`,
        REMINDER_KIND[text(d.kind)] ?? text(d.kind).replace('_', ' '),
        text(d.to) && `to ${text(d.to)}`,
        text(d.why),
      );
    case 'hold.placed':
    case 'hold.cancelled':
      return `${thing}${person ? ` for${person}` : ''}`;
    case 'kit_box.built':
    case 'kit_box.refilled': {
      const added = Array.isArray(d.added) ? (d.added as string[]) : [];
      const removed = Array.isArray(d.removed) ? (d.removed as string[]) : [];
      return join(
        thing,
        added.length ? `added ${added.join(', ')}` : '',
        removed.length ? `took out ${removed.join(', ')}` : '',
      );
    }
    case 'kit_box.taken_out':
    case 'kit_box.unit_swapped':
      return join(
        thing,
        `${text(d.removed)} ${text(d.to)}`.trim(),
        text(d.replacement) && `in its place ${text(d.replacement)}`,
        text(d.reason) && `“${text(d.reason)}”`,
      );
    case 'kit_box.taken_apart': {
      const back = Array.isArray(d.returned) ? (d.returned as string[]) : [];
      return join(
        thing,
        back.length ? `back on the shelf: ${back.join(', ')}` : '',
        text(d.reason) && `“${text(d.reason)}”`,
      );
    }
    default:
      return thing;
  }
}
