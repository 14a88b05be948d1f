import 'server-only';
import type { NextAuthOptions } from 'next-auth';
import CredentialsProvider from 'next-auth/providers/credentials';
import { db } from '@/db';
import { checkPassword, consumeSignInToken } from './signin';
import { recordFailure, recordSuccess, secondsToWait, sourceOf } from './throttle';
import { endSession, isSessionOpen, openSession, SESSION_SECONDS } from './sessions';
import { safeCallbackUrl } from './safe-next';
import { audit } from '@/lib/audit/log';

// JWT session cookies signed with NEXTAUTH_SECRET; httpOnly, SameSite=Lax, and Secure whenever
// NEXTAUTH_URL is https (next-auth's own rule). Each cookie names a row of auth_sessions
// (lib/auth/sessions.ts), so sign-out ends it on the server.
export const authOptions: NextAuthOptions = {
  session: { strategy: 'jwt', maxAge: SESSION_SECONDS },
  pages: { signIn: '/signin', error: '/signin' },
  providers: [
    CredentialsProvider({
      id: 'password',
      name: 'E-mail and password',
      credentials: { email: { type: 'email' }, password: { type: 'password' } },
      async authorize(credentials, req) {
        const email = String(credentials?.email ?? '').trim().toLowerCase();
        const password = String(credentials?.password ?? '');
        if (!email || !password || email.length > 320 || password.length > 200) return null;
        // Growing waits per e-mail and source address (lib/auth/throttle.ts), never a lock.
        const source = sourceOf(req?.headers);
        if ((await secondsToWait(email, source)) > 0) throw new Error('TooManyAttempts');
        const user = await checkPassword(db, email, password);
        if (!user) {
          await recordFailure(email, source);
          return null;
        }
        await recordSuccess(email, source);
        await audit(db, { spaceId: null, actorId: user.id, action: 'auth.signed_in' });
        return user;
      },
    }),
    CredentialsProvider({
      id: 'email-link',
      name: 'Sign-in link',
      credentials: { token: { type: 'text' } },
      async authorize(credentials) {
        const token = String(credentials?.token ?? '');
        if (!/^[A-Za-z0-9_-]{20,100}$/.test(token)) return null;
        return consumeSignInToken(db, token);
      },
    }),
  ],
  callbacks: {
    async jwt({ token, user }) {
      if (user) {
        // A sign-in: the cookie will carry a fresh server-side session.
        token.uid = user.id;
        token.sid = await openSession(db, user.id);
        return token;
      }
      // next-auth's own session endpoint: a session ended on the server is nobody (the cookie is cleared).
      if (!(await isSessionOpen(db, token.sid, token.uid))) throw new Error('SessionEnded');
      return token;
    },
    async session({ session, token }) {
      if (session.user) (session.user as { id?: string }).id = token.uid as string;
      return session;
    },
    // Every callback URL next-auth honours goes through the one same-origin rule.
    async redirect({ url, baseUrl }) {
      return safeCallbackUrl(url, baseUrl);
    },
  },
  events: {
    async signOut({ token }) {
      await endSession(db, token?.sid);
    },
  },
};
