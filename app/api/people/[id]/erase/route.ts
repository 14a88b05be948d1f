import { z } from 'zod';
import { db } from '@/db';
import { idParams, json, route } from '@/lib/http/route';
import { erasePerson } from '@/lib/people/erase';

const body = z.object({ confirmEmail: z.string({ error: 'the person’s e-mail address' }).trim().min(1, 'type the person’s e-mail address').max(320) }).strict();

export const POST = route({
  method: 'POST',
  summary: 'Erases a person’s personal data on request; their loans, sales and audit stay against a placeholder',
  who: ['admin'],
  params: idParams,
  notFound: 'person',
  body: json(body),
  response: z.object({ person: z.object({ id: z.string(), name: z.string() }) }),
  run: async ({ ctx, params, body }) => ({ person: await erasePerson(db, ctx, params.id, body) }),
});
