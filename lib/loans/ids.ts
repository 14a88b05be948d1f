import { NotFoundError } from '@/lib/errors';
import { isId } from '@/lib/ids';

/** A path id that is not even a uuid names nothing: 404, like an id of another space (pages). */
export function idOr404(value: string, what = 'record'): string {
  if (!isId(value)) throw new NotFoundError(`No such ${what}.`);
  return value;
}
