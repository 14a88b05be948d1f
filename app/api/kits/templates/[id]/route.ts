import { z } from 'zod';
import { db } from '@/db';
import { idParams, json, route, STAFF } from '@/lib/http/route';
import { one } from '@/lib/http/shapes';
import { templateSchema } from '@/lib/kits/schemas';
import { getTemplate, updateTemplate } from '@/lib/kits/templates';

export const GET = route({
  method: 'GET',
  summary: 'A kit template with its lines',
  who: 'signed-in',
  params: idParams,
  notFound: 'kit',
  response: one('template', 'The template with its lines and cautions.'),
  run: async ({ ctx, params }) => ({ template: await getTemplate(db, ctx, params.id) }),
});

export const PUT = route({
  method: 'PUT',
  summary: 'Replaces a template: name, notes, cautions and the whole list of lines',
  who: STAFF,
  params: idParams,
  notFound: 'kit',
  body: json(templateSchema),
  response: z.object({ template: z.object({ id: z.string() }) }),
  run: async ({ ctx, params, body }) => {
    await updateTemplate(db, ctx, params.id, body);
    return { template: { id: params.id } };
  },
});
