import { NextResponse } from 'next/server';
import { z } from 'zod';
import { db } from '@/db';
import { health } from '@/lib/health/check';
import { route } from '@/lib/http/route';

const probe = z.object({ ok: z.boolean(), ms: z.number() });

// For a monitor: 200 when the database, the job queue and the mail server all answer, else 503 with the
// same body. Public, and says nothing but yes/no per part, timings and the version.
export const GET = route({
  method: 'GET',
  summary: 'Health of the database, the job queue and the mail server (public; no settings or secrets)',
  who: 'anonymous',
  response: z.object({ ok: z.boolean(), version: z.string(), checks: z.object({ database: probe, jobs: probe, mail: probe }) }),
  run: async () => {
    const h = await health(db);
    return NextResponse.json(h, { status: h.ok ? 200 : 503, headers: { 'cache-control': 'no-store' } });
  },
});
