import { z } from 'zod';
import { NotFoundError } from '@/lib/errors';

/** A sale id from the URL; anything that is not a UUID simply names no sale (404). */
export async function saleIdParam(params: Promise<{ id: string }>): Promise<string> {
  const { id } = await params;
  if (!z.uuid().safeParse(id).success) throw new NotFoundError('No such sale.');
  return id;
}
