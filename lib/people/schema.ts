import { z } from 'zod';
import type { Role } from '@/db/types';
import { ROLES } from '@/lib/auth/roles';

// Input shapes for People and invitations, shared by the route handlers and the forms.

/** How each role is written on screen. */
export const ROLE_WORDS: Record<Role, string> = {
  member: 'Member',
  steward: 'Steward',
  treasurer: 'Treasurer',
  admin: 'Admin',
};

export const roleSchema = z.enum(ROLES as [Role, ...Role[]], {
  error: 'one of member, steward, treasurer, admin',
});

/** A set of roles: at least one, each once, kept in the fixed order of ROLES. */
export const rolesSchema = z
  .array(roleSchema, { error: 'a list of roles' })
  .min(1, 'choose at least one role')
  .transform((roles) => ROLES.filter((r) => roles.includes(r)));

export const emailSchema = z
  .string({ error: 'an e-mail address' })
  .trim()
  .toLowerCase()
  .max(320, 'at most 320 characters')
  .meta({ format: 'email' })
  .pipe(z.email('a valid e-mail address'));

export const personNameSchema = z
  .string({ error: 'a name' })
  .trim()
  .min(1, 'enter a name')
  .max(120, 'at most 120 characters');

export const MIN_PASSWORD = 10;
export const passwordSchema = z
  .string({ error: 'a password' })
  .min(MIN_PASSWORD, `at least ${MIN_PASSWORD} characters`)
  .max(200, 'at most 200 characters');

export const inviteSchema = z.object({ name: personNameSchema, email: emailSchema, roles: rolesSchema });
export type InviteInput = z.infer<typeof inviteSchema>;

export const updatePersonSchema = z
  .object({ roles: rolesSchema.optional(), disabled: z.boolean({ error: 'true or false' }).optional() })
  .strict()
  .refine((v) => v.roles !== undefined || v.disabled !== undefined, {
    message: 'send roles, disabled or both',
    path: ['roles'],
  })
  .describe('Send roles, disabled or both.');
export type UpdatePersonInput = z.infer<typeof updatePersonSchema>;

// The token only ever comes from our own link: URL-safe base64 of 32 bytes (lib/auth/tokens.ts).
export const invitationTokenSchema = z
  .string({ error: 'the token from the invitation link' })
  .regex(/^[A-Za-z0-9_-]{20,100}$/, 'the token from the invitation link');

/** Accepting: a new person chooses a name and password; someone who already has an account sends neither. */
export const acceptInvitationSchema = z.object({
  token: invitationTokenSchema,
  name: personNameSchema.optional(),
  password: passwordSchema.optional(),
});
export type AcceptInvitationInput = z.infer<typeof acceptInvitationSchema>;

/** The welcome form for a new person, with the password typed twice. */
export const welcomeFormSchema = z
  .object({ name: personNameSchema, password: passwordSchema, confirm: z.string() })
  .refine((v) => v.password === v.confirm, { message: 'the two passwords differ', path: ['confirm'] });
export type WelcomeFormInput = z.infer<typeof welcomeFormSchema>;

