import { db } from '@/db';
import { route } from '@/lib/http/route';
import { listOf } from '@/lib/http/shapes';
import { listRepairs } from '@/lib/inventory/units';

export const GET = route({
  method: 'GET',
  summary: 'Units in repair',
  who: 'signed-in',
  response: listOf('units', 'A unit in repair.'),
  run: async ({ ctx }) => ({ units: await listRepairs(db, ctx) }),
});
