import { notFound } from 'next/navigation';
import { NotFoundError } from '@/lib/errors';

/** A service's NotFoundError (another space's record, or none) becomes the 404 page. */
export async function notFoundUnlessFound<T>(p: Promise<T>): Promise<T> {
  try {
    return await p;
  } catch (err) {
    if (err instanceof NotFoundError) notFound();
    throw err;
  }
}
