import { db } from '@/db';
import { idParams, json, route, STAFF } from '@/lib/http/route';
import { record } from '@/lib/http/shapes';
import { deleteLocation, getLocation, updateLocation } from '@/lib/inventory/locations';
import { locationUpdateSchema } from '@/lib/inventory/schemas';

export const GET = route({
  method: 'GET',
  summary: 'A location with what it holds',
  who: 'signed-in',
  params: idParams,
  notFound: 'location',
  response: record('The location, its children and its stock.'),
  run: ({ ctx, params }) => getLocation(db, ctx, params.id),
});

export const PATCH = route({
  method: 'PATCH',
  summary: 'Renames or moves a location',
  who: STAFF,
  params: idParams,
  notFound: 'location',
  body: json(locationUpdateSchema),
  response: record('The location.'),
  run: ({ ctx, params, body }) => updateLocation(db, ctx, params.id, body),
});

export const DELETE = route({
  method: 'DELETE',
  summary: 'Removes an empty location (409 otherwise)',
  who: STAFF,
  params: idParams,
  notFound: 'location',
  response: record('{ deleted }'),
  run: ({ ctx, params }) => deleteLocation(db, ctx, params.id),
});
