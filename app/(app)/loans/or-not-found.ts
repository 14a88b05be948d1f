import { notFound } from 'next/navigation';
import { NotFoundError } from '@/lib/errors';
import { idOr404 } from '@/lib/loans/ids';

/** For pages: a missing (or another space's) record shows the not-found page. */
export async function orNotFound<T>(load: () => Promise<T>): Promise<T> {
  try {
    return await load();
  } catch (err) {
    if (err instanceof NotFoundError) notFound();
    throw err;
  }
}

export function pageId(id: string): string {
  try {
    return idOr404(id);
  } catch {
    notFound();
  }
}
