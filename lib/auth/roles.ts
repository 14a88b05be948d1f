import type { Role } from '@/db/types';

export const ROLES: readonly Role[] = ['member', 'steward', 'treasurer', 'admin'] as const;

/** The signed-in person's context in their current space, passed to every service. */
export type Ctx = {
  userId: string;
  email: string;
  name: string;
  spaceId: string;
  spaceName: string;
  roles: Role[];
  spaces: { id: string; name: string; roles: Role[] }[];
};

export function hasRole(ctx: Pick<Ctx, 'roles'>, ...any: Role[]): boolean {
  return any.some((r) => ctx.roles.includes(r));
}

/** Stewards and admins act on everyone's loans; members only on their own. */
export const isStaff = (ctx: Pick<Ctx, 'roles'>) => hasRole(ctx, 'steward', 'admin');
