// What bench/run.ts and bench/profile.ts both do around their loads: sign a bench person in over HTTP, and
// put the bench space's open loans back between borrow phases.
import type pg from 'pg';

/** Signs `email` in at `origin` (a production build); answers the Cookie header of the session. */
export async function signInCookie(origin: string, email: string, password: string): Promise<string> {
  // The helper reads TEST_BASE_URL when it is loaded; the bench has no test server.
  process.env.TEST_BASE_URL ??= origin;
  const { HttpSession } = await import('../tests/helpers/http');
  const s = new HttpSession(origin);
  await s.signIn(email, password);
  if (!(await s.isSignedIn())) throw new Error(`bench sign-in failed for ${email}`);
  return s.cookieHeader();
}

/** Marks every open loan of the bench space returned, so each phase starts under the open-loan limit. */
export async function closeBenchLoans(pool: pg.Pool, spaceId: string): Promise<void> {
  await pool.query(`update loans set status = 'returned', returned_at = now() where space_id = $1 and status = 'out'`, [spaceId]);
}
