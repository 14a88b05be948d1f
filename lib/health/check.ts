import 'server-only';
import { sql } from 'kysely';
import type { Db } from '@/db/connect';
import { mailReachable } from '@/lib/mail/server';
import { APP_VERSION } from '@/lib/version';

// What a monitor polls (GET /api/health): is the database answering, is the job queue's schema there
// with its schedules, does the mail server answer. Only yes/no and timings: no hosts, names or settings.

export type Probe = { ok: boolean; ms: number };
export type Health = { ok: boolean; version: string; checks: { database: Probe; jobs: Probe; mail: Probe } };

const PROBE_TIMEOUT_MS = 4_000;

async function probe(fn: () => Promise<boolean>): Promise<Probe> {
  const started = performance.now();
  let timer: NodeJS.Timeout | undefined;
  const timeout = new Promise<boolean>((resolve) => (timer = setTimeout(() => resolve(false), PROBE_TIMEOUT_MS)));
  const ok = await Promise.race([fn().catch(() => false), timeout]);
  clearTimeout(timer);
  return { ok, ms: Math.round(performance.now() - started) };
}

export async function health(db: Db): Promise<Health> {
  const [database, jobs, mail] = await Promise.all([
    probe(async () => {
      await sql`select 1`.execute(db);
      return true;
    }),
    // pg-boss keeps its schedules in its own schema: present once a runner has started.
    probe(async () => {
      const r = await sql<{ n: number }>`select count(*)::int as n from pgboss.schedule`.execute(db);
      return (r.rows[0]?.n ?? 0) > 0;
    }),
    probe(() => mailReachable()),
  ]);
  return { ok: database.ok && jobs.ok && mail.ok, version: APP_VERSION, checks: { database, jobs, mail } };
}
