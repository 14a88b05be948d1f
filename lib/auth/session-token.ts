import 'server-only';
import { createSecretKey, hkdfSync, type KeyObject } from 'node:crypto';
import { jwtDecrypt, type JWTPayload } from 'jose';

// Reads next-auth's session cookie on the way in. The cookie is a JWE (alg "dir", enc "A256GCM") whose
// key is HKDF-SHA256 of NEXTAUTH_SECRET (empty salt, info "NextAuth.js Generated Encryption Key",
// 32 bytes) — next-auth v4's jwt/index.js. Its own decode() derives that key again on every call, an
// asynchronous HKDF on libuv's thread pool per request; the key only changes with the secret, so it is
// derived once per process here and the decryption is left to jose, the library next-auth itself uses.
// tests/unit/auth/session-token.test.ts checks the answers against next-auth's own encode/decode.

const INFO = 'NextAuth.js Generated Encryption Key';
let derived: { secret: string; key: KeyObject } | undefined;

/** The cookie's decryption key for `secret`, derived on first use. */
export function sessionKey(secret: string): KeyObject {
  if (derived?.secret !== secret) {
    derived = { secret, key: createSecretKey(Buffer.from(hkdfSync('sha256', secret, '', INFO, 32))) };
  }
  return derived.key;
}

/**
 * The claims of a session cookie, or a thrown error when it was tampered with, made with another secret
 * or has expired (next-auth's 15-second clock tolerance).
 */
export async function decodeSessionToken(token: string, secret: string): Promise<JWTPayload> {
  const { payload } = await jwtDecrypt(token, sessionKey(secret), { clockTolerance: 15 });
  return payload;
}
