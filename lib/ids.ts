import { z } from 'zod';

// The one shape of a record id (a UUID), used by the route declaration for `[id]` segments and by the
// services that take an id from elsewhere. An id that is not even a UUID names nothing: 404.
export const idSchema = z.uuid({ error: 'not a valid id' });

export const isId = (value: unknown): value is string => idSchema.safeParse(value).success;
