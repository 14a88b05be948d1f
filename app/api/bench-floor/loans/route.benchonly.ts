import { z } from 'zod';
import { ConflictError } from '@/lib/errors';
import { json, route } from '@/lib/http/route';
import { borrowCounted, type BorrowInput } from '../floor-sql';
import { pool, requireBench } from '../pool';

export const dynamic = 'force-dynamic';

// Framework floor of the borrow transaction (bench/): the SQL of POST /api/loans for one counted item
// with no sign-in, no validation beyond JSON and no space scoping. Only in the bench build.
export const POST = route({
  method: 'POST',
  summary: 'Benchmark baseline: the borrow SQL with nothing around it (bench build only)',
  who: 'anonymous',
  body: json(z.custom<BorrowInput>((v) => typeof v === 'object' && v !== null, 'a borrow body')),
  status: 201,
  run: async ({ body }) => {
    requireBench();
    const result = await borrowCounted(pool(), body);
    if ('conflict' in result) throw new ConflictError(result.conflict);
    return { loan: result };
  },
});
