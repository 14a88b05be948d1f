import { z } from 'zod';
import { db } from '@/db';
import { route } from '@/lib/http/route';
import { record } from '@/lib/http/shapes';
import { listRepairs } from '@/lib/inventory/units';
import { boxesOutOfService } from '@/lib/kits/upkeep';

export const GET = route({
  method: 'GET',
  summary: 'Units in repair and kit boxes out of service (with what each box lacks and its last short return)',
  who: 'signed-in',
  response: z.object({
    units: z.array(record('A unit in repair.')),
    boxes: z.array(record('A kit box out of service.')),
  }),
  run: async ({ ctx }) => {
    const [units, boxes] = await Promise.all([listRepairs(db, ctx), boxesOutOfService(db, ctx)]);
    return { units, boxes };
  },
});
