import 'server-only';
import { z } from 'zod';
import type { Role } from '@/db/types';
import { AppError, type FieldErrors } from '@/lib/errors';
import { zodFields } from '@/lib/http/respond';
import { requireRole, requireUser } from './guard';
import type { Ctx } from './roles';

export type ActionState = { ok?: boolean; message?: string; fieldErrors?: FieldErrors; data?: unknown };

/**
 * Server actions in one fixed order: role on the server first, then the form parsed with zod, then the
 * service. Answers { fieldErrors, message } for the form instead of throwing.
 */
export function action<S extends z.ZodType>(
  roles: Role[] | 'any',
  schema: S,
  run: (ctx: Ctx, input: z.infer<S>) => Promise<ActionState | void>,
) {
  return async (_prev: ActionState | undefined, form: FormData): Promise<ActionState> => {
    try {
      const ctx = roles === 'any' ? await requireUser() : await requireRole(...roles);
      const parsed = schema.safeParse(Object.fromEntries(form.entries()));
      if (!parsed.success) return { message: 'Check the highlighted fields.', fieldErrors: zodFields(parsed.error) };
      return (await run(ctx, parsed.data)) ?? { ok: true };
    } catch (err) {
      if (err instanceof AppError) return { message: err.message, fieldErrors: err.fields };
      if (err && typeof err === 'object' && 'digest' in err) throw err; // redirect() / notFound()
      console.error(err);
      return { message: 'Something went wrong on our side.' };
    }
  };
}
