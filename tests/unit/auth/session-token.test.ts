import { describe, expect, test } from 'vitest';
import { decode, encode } from 'next-auth/jwt';
import { decodeSessionToken, sessionKey } from '@/lib/auth/session-token';

// The way in reads the session cookie with a key derived once per process (lib/auth/session-token.ts).
// It must answer exactly as next-auth's own decode does, for good cookies and bad ones alike.

const SECRET = 'unit-test-secret-0123456789abcdef';
const claims = { uid: '6f1c8a52-3b7e-4d21-9a0f-2c4b8e7d1a93', sid: 'b2d94f1e-7a35-4c88-8e1b-5f0a3c9d2e64', name: 'Test person' };

describe('session cookie decoding with a cached key', () => {
  test('a cookie next-auth encoded reads the same as next-auth decodes it', async () => {
    const token = await encode({ token: claims, secret: SECRET, maxAge: 3600 });
    const ours = await decodeSessionToken(token, SECRET);
    const theirs = await decode({ token, secret: SECRET });
    expect(ours).toEqual(theirs);
    expect(ours).toMatchObject(claims);
    // Read again with the cached key: still the same.
    expect(await decodeSessionToken(token, SECRET)).toEqual(theirs);
  });

  test('the key is derived once per secret, and again when the secret changes', () => {
    const a = sessionKey(SECRET);
    expect(sessionKey(SECRET)).toBe(a);
    const b = sessionKey(`${SECRET}-rotated`);
    expect(b).not.toBe(a);
    expect(b.export().equals(a.export())).toBe(false);
  });

  test('a cookie made with another secret is refused, as next-auth refuses it', async () => {
    const token = await encode({ token: claims, secret: 'another-secret-0123456789abcdef', maxAge: 3600 });
    await expect(decode({ token, secret: SECRET })).rejects.toThrow();
    await expect(decodeSessionToken(token, SECRET)).rejects.toThrow();
  });

  test('a tampered cookie is refused', async () => {
    const token = await encode({ token: claims, secret: SECRET, maxAge: 3600 });
    const parts = token.split('.');
    // Flip one character of the ciphertext (GCM's tag then fails).
    const c = parts[3];
    parts[3] = (c[0] === 'A' ? 'B' : 'A') + c.slice(1);
    const bad = parts.join('.');
    await expect(decode({ token: bad, secret: SECRET })).rejects.toThrow();
    await expect(decodeSessionToken(bad, SECRET)).rejects.toThrow();
  });

  test('an expired cookie is refused beyond the same 15-second tolerance', async () => {
    // maxAge −60 s: expired a minute ago, past the tolerance.
    const old = await encode({ token: claims, secret: SECRET, maxAge: -60 });
    await expect(decode({ token: old, secret: SECRET })).rejects.toThrow(/exp/);
    await expect(decodeSessionToken(old, SECRET)).rejects.toThrow(/exp/);
    // maxAge −5 s: expired, but inside the tolerance for both.
    const recent = await encode({ token: claims, secret: SECRET, maxAge: -5 });
    expect(await decodeSessionToken(recent, SECRET)).toEqual(await decode({ token: recent, secret: SECRET }));
  });
});
