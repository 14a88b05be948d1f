import { describe, expect, it } from 'vitest';
import { dumpsToKeep, nightlyName, parseNightlyName, type Dump } from '@/lib/backup/retention';

// The retention rule: the newest dump of each of the last 7 days and of each of the last 4 ISO weeks
// (Monday first, ISO 8601), in UTC. common practice (no source) for the 7 + 4 counts themselves.
const nights = (from: string, count: number): Dump[] =>
  Array.from({ length: count }, (_, i) => {
    const at = new Date(Date.parse(from) + i * 86_400_000);
    return { name: nightlyName(at), at };
  });

describe('dumpsToKeep', () => {
  it('after 60 nightly dumps keeps the last 7 days and the newest of each of the 3 weeks before', () => {
    const dumps = nights('2026-10-01T02:30:00Z', 60); // up to 2026-11-29 (a Sunday)
    const now = new Date('2026-11-29T03:00:00Z');
    const kept = [...dumpsToKeep(dumps, now)].sort();
    expect(kept).toEqual(
      [
        // daily: 23 … 29 November
        '20261123', '20261124', '20261125', '20261126', '20261127', '20261128', '20261129',
        // weekly: the Sundays closing the weeks that began on 16, 9 and 2 November (this week's is the 29th)
        '20261122', '20261115', '20261108',
      ]
        .map((d) => `nightly-${d}T023000Z.dump`)
        .sort(),
    );
  });

  it('keeps the newest of two dumps on one day, and never judges a dump from after now', () => {
    const a = { name: 'a', at: new Date('2026-11-29T01:00:00Z') };
    const b = { name: 'b', at: new Date('2026-11-29T02:00:00Z') };
    const later = { name: 'later', at: new Date('2026-11-30T02:00:00Z') };
    expect([...dumpsToKeep([a, b, later], new Date('2026-11-29T05:00:00Z'))].sort()).toEqual(['b', 'later']);
  });

  it('keeps everything when there are fewer dumps than slots', () => {
    const dumps = nights('2026-11-27T02:30:00Z', 3);
    expect(dumpsToKeep(dumps, new Date('2026-11-29T12:00:00Z')).size).toBe(3);
  });
});

describe('nightly file names', () => {
  it('round-trip to the second, and ignore other files', () => {
    const at = new Date('2026-12-02T02:30:07Z');
    expect(nightlyName(at)).toBe('nightly-20261202T023007Z.dump');
    expect(parseNightlyName(nightlyName(at))).toEqual({ name: nightlyName(at), at });
    expect(parseNightlyName('before-migrate-20261202T023007Z.dump')).toBeNull();
    expect(parseNightlyName('nightly-20261202T023007Z.dump.partial')).toBeNull();
  });
});
