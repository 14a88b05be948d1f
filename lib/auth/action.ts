import 'server-only';
import { z } from 'zod';
import { AppError, type FieldErrors } from '@/lib/errors';
import { zodFields } from '@/lib/http/respond';
import { resolveCaller, type Who } from '@/lib/http/route';
import type { Ctx } from './roles';
import { log } from '@/lib/log';

export type ActionState = { ok?: boolean; message?: string; fieldErrors?: FieldErrors; data?: unknown };
type SignedIn = Exclude<Who, 'anonymous' | 'signature'>;

/**
 * Server actions through the same gate as route handlers (lib/http/route.ts): Next checks an action's
 * origin itself, then the caller is resolved with the same `who` vocabulary ('signed-in' or roles),
 * then the form is parsed with zod, then the service runs. Answers { fieldErrors, message } for a form
 * used with useActionState instead of throwing.
 */
export function action<S extends z.ZodType>(
  who: SignedIn,
  schema: S,
  run: (ctx: Ctx, input: z.infer<S>) => Promise<ActionState | void>,
) {
  return async (_prev: ActionState | undefined, form: FormData): Promise<ActionState> => {
    try {
      const ctx = (await resolveCaller(who)) as Ctx;
      const parsed = schema.safeParse(Object.fromEntries(form.entries()));
      if (!parsed.success) return { message: 'Check the highlighted fields.', fieldErrors: zodFields(parsed.error) };
      return (await run(ctx, parsed.data)) ?? { ok: true };
    } catch (err) {
      if (err instanceof AppError) return { message: err.message, fieldErrors: err.fields };
      if (err && typeof err === 'object' && 'digest' in err) throw err; // redirect() / notFound()
      log.error({ err }, 'server action failed');
      return { message: 'Something went wrong on our side.' };
    }
  };
}

/**
 * The same gate for a plain `<form action={…}>` (no form state): caller, then zod; input that does not
 * parse goes to `invalid` (usually a redirect), never to the service.
 */
export function formAction<S extends z.ZodType>(
  who: SignedIn,
  schema: S,
  run: (ctx: Ctx, input: z.infer<S>) => Promise<void>,
  invalid: () => never,
) {
  return async (form: FormData): Promise<void> => {
    const ctx = (await resolveCaller(who)) as Ctx;
    const parsed = schema.safeParse(Object.fromEntries(form.entries()));
    if (!parsed.success) invalid();
    await run(ctx, parsed.data);
  };
}
