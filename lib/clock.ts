// The one place "now" comes from, so tests can move the clock (overdue loans, reminders) without
// touching the machine's time. The offset is only honoured when OHM_TEST_HOOKS=1.
import { rawEnv } from '@/lib/env';

const g = globalThis as unknown as { ohmClockOffsetMs?: number };

export function now(): Date {
  return new Date(Date.now() + (rawEnv().OHM_TEST_HOOKS === '1' ? (g.ohmClockOffsetMs ?? 0) : 0));
}

export function setClockOffset(ms: number): void {
  if (rawEnv().OHM_TEST_HOOKS !== '1') throw new Error('clock offset is only for tests');
  g.ohmClockOffsetMs = ms;
}
