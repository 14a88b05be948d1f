import { TZDate } from '@date-fns/tz';
import { formatDateTime } from './format';

// Times people keep (receipts, the treasurer's files) say which clock they were read on.

/** ISO 8601 on the wall clock of `timeZone`, with its offset: 2026-11-30T21:00:00-06:00. */
export function isoInZone(at: Date | string, timeZone: string): string {
  return new TZDate(new Date(at).getTime(), timeZone).toISOString().replace(/\.\d{3}(?=[+-]|Z)/, '');
}

/** The offset of `timeZone` at that instant, as UTC±hh:mm. */
export function utcOffset(at: Date | string, timeZone: string): string {
  const iso = isoInZone(at, timeZone);
  const m = /([+-]\d{2}:\d{2})$/.exec(iso);
  return `UTC${m ? m[1].replace('-', '−') : '+00:00'}`;
}

/** "30 Nov 2026, 21:00 (America/Chicago, UTC−06:00)": the local time with the zone it is in. */
export function formatDateTimeWithZone(at: Date | string, timeZone: string): string {
  return `${formatDateTime(at, timeZone)} (${timeZone}, ${utcOffset(at, timeZone)})`;
}
