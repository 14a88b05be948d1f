import 'server-only';
import { requireRole, requireUser } from '@/lib/auth/guard';

// Who may do what on the shelf: every member reads; stewards and admins change things.
export const shelfReader = () => requireUser();
export const shelfWriter = () => requireRole('steward', 'admin');

/** Next 16 hands dynamic route params as a promise. */
export type RouteParams<T extends Record<string, string>> = { params: Promise<T> };
