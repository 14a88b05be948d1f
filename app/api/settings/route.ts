import { db } from '@/db';
import { json, route } from '@/lib/http/route';
import { one } from '@/lib/http/shapes';
import { settingsPatchSchema } from '@/lib/settings/schema';
import { getSettings, updateSettings } from '@/lib/settings/settings';

export const GET = route({
  method: 'GET',
  summary: 'The rules of the admin’s current space',
  who: ['admin'],
  response: one('settings', 'The space’s settings.'),
  run: async ({ ctx }) => ({ settings: await getSettings(db, ctx) }),
});

export const PATCH = route({
  method: 'PATCH',
  summary: 'Changes any subset of the rules; each field is validated and named on error',
  who: ['admin'],
  body: json(settingsPatchSchema),
  response: one('settings', 'The space’s settings.'),
  run: async ({ ctx, body }) => ({ settings: await updateSettings(db, ctx, body) }),
});
