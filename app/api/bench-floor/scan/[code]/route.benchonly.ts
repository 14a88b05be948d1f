import { z } from 'zod';
import { NotFoundError } from '@/lib/errors';
import { route } from '@/lib/http/route';
import { lookupByCode } from '../../floor-sql';
import { pool, requireBench } from '../../pool';

export const dynamic = 'force-dynamic';

// Framework floor of the scan → item lookup (bench/): the SQL of GET /api/scan/[code] with no sign-in,
// no validation and no space scoping. Only in the bench build.
export const GET = route({
  method: 'GET',
  summary: 'Benchmark baseline: the label lookup SQL with nothing around it (bench build only)',
  who: 'anonymous',
  params: z.object({ code: z.string() }),
  run: async ({ params }) => {
    requireBench();
    const found = await lookupByCode(pool(), params.code);
    if (!found) throw new NotFoundError();
    return Response.json(found, { headers: { 'Cache-Control': 'private, no-store' } });
  },
});
