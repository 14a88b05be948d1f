import { hash, verify } from '@node-rs/argon2';

// Argon2id with the library's defaults (19 MiB, 2 passes; the OWASP minimum). It runs in libuv's
// thread pool, so a burst of sign-ins does not stall the event loop the way a JavaScript hash would.
export const hashPassword = (plain: string) => hash(plain);

export async function verifyPassword(plain: string, stored: string): Promise<boolean> {
  try {
    return await verify(stored, plain);
  } catch {
    return false; // not an Argon2 hash: no match
  }
}
