// Which nightly dumps to keep: the newest of each of the last `daily` days and the newest of each of the
// last `weekly` weeks (weeks start on Monday, ISO 8601), all in UTC, counted back from `now`. Anything
// else is pruned. Pure, so the rule is tested on its own (tests/unit/backup-retention.test.ts).

export type Dump = { name: string; at: Date };
const DAY = 86_400_000;

const startOfDay = (d: Date) => Date.UTC(d.getUTCFullYear(), d.getUTCMonth(), d.getUTCDate());
const startOfWeek = (d: Date) => startOfDay(d) - ((d.getUTCDay() + 6) % 7) * DAY;

function newestIn(dumps: Dump[], from: number, to: number): Dump | undefined {
  let best: Dump | undefined;
  for (const d of dumps) {
    const t = d.at.getTime();
    if (t >= from && t < to && (!best || t > best.at.getTime())) best = d;
  }
  return best;
}

export function dumpsToKeep(dumps: Dump[], now: Date, daily = 7, weekly = 4): Set<string> {
  const keep = new Set<string>();
  for (const d of dumps) if (d.at.getTime() > now.getTime()) keep.add(d.name); // not ours to judge yet
  const today = startOfDay(now);
  for (let i = 0; i < daily; i++) {
    const hit = newestIn(dumps, today - i * DAY, today - i * DAY + DAY);
    if (hit) keep.add(hit.name);
  }
  const week = startOfWeek(now);
  for (let i = 0; i < weekly; i++) {
    const hit = newestIn(dumps, week - i * 7 * DAY, week - i * 7 * DAY + 7 * DAY);
    if (hit) keep.add(hit.name);
  }
  return keep;
}

const NAME = /^nightly-(\d{4})(\d{2})(\d{2})T(\d{2})(\d{2})(\d{2})Z\.dump$/;

/** The file name of a nightly dump taken at `at`, and back. */
export function nightlyName(at: Date): string {
  return `nightly-${at.toISOString().replace(/[-:]/g, '').replace(/\.\d{3}/, '')}.dump`;
}
export function parseNightlyName(name: string): Dump | null {
  const m = NAME.exec(name);
  return m ? { name, at: new Date(Date.UTC(+m[1]!, +m[2]! - 1, +m[3]!, +m[4]!, +m[5]!, +m[6]!)) } : null;
}
