import { db } from '@/db';
import { json, route, STAFF } from '@/lib/http/route';
import { listOf, record } from '@/lib/http/shapes';
import { createLocation, listLocations } from '@/lib/inventory/locations';
import { locationCreateSchema } from '@/lib/inventory/schemas';

export const GET = route({
  method: 'GET',
  summary: 'Locations of the space (rooms, shelves, bins)',
  who: 'signed-in',
  response: listOf('locations', 'A location with its label code.'),
  run: async ({ ctx }) => ({ locations: await listLocations(db, ctx) }),
});

export const POST = route({
  method: 'POST',
  summary: 'Creates a location ({ name, kind?, parentId? }) with its label code',
  who: STAFF,
  body: json(locationCreateSchema),
  status: 201,
  response: record('The new location.'),
  run: ({ ctx, body }) => createLocation(db, ctx, body),
});
