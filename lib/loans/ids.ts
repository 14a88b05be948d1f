import { z } from 'zod';
import { NotFoundError } from '@/lib/errors';

const uuid = z.uuid();

/** A path id that is not even a uuid names nothing: 404, like an id of another space. */
export function idOr404(value: string, what = 'record'): string {
  if (!uuid.safeParse(value).success) throw new NotFoundError(`No such ${what}.`);
  return value;
}

export type IdParams = { params: Promise<{ id: string }> };
