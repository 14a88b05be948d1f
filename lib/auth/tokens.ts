import { createHash, randomBytes } from 'node:crypto';

/** A random URL-safe token; only its hash is stored, so a database leak leaks no live link. */
export function newToken(): { token: string; hash: string } {
  const token = randomBytes(32).toString('base64url');
  return { token, hash: hashToken(token) };
}
export const hashToken = (token: string) => createHash('sha256').update(token).digest('hex');
