import { db } from '@/db';
import { json, route, STAFF } from '@/lib/http/route';
import { listOf, one } from '@/lib/http/shapes';
import { templateSchema } from '@/lib/kits/schemas';
import { createTemplate, listTemplates } from '@/lib/kits/templates';

export const GET = route({
  method: 'GET',
  summary: 'Kit templates of the space',
  who: 'signed-in',
  response: listOf('templates', 'A kit template.'),
  run: async ({ ctx }) => ({ templates: await listTemplates(db, ctx) }),
});

export const POST = route({
  method: 'POST',
  summary: 'Creates a kit template',
  who: STAFF,
  body: json(templateSchema),
  status: 201,
  response: one('template', 'The new template.'),
  run: async ({ ctx, body }) => ({ template: await createTemplate(db, ctx, body) }),
});
