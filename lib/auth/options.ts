import 'server-only';
import type { NextAuthOptions } from 'next-auth';
import CredentialsProvider from 'next-auth/providers/credentials';
import { db } from '@/db';
import { checkPassword, consumeSignInToken } from './signin';
import { remaining, signInLimiter, take } from './rate-limit';
import { audit } from '@/lib/audit/log';

// JWT sessions signed with NEXTAUTH_SECRET; cookies are httpOnly, SameSite=Lax, and Secure
// whenever NEXTAUTH_URL is https (next-auth's own rule).
export const authOptions: NextAuthOptions = {
  session: { strategy: 'jwt', maxAge: 12 * 60 * 60 },
  pages: { signIn: '/signin', error: '/signin' },
  providers: [
    CredentialsProvider({
      id: 'password',
      name: 'E-mail and password',
      credentials: { email: { type: 'email' }, password: { type: 'password' } },
      async authorize(credentials) {
        const email = String(credentials?.email ?? '').trim().toLowerCase();
        const password = String(credentials?.password ?? '');
        if (!email || !password || email.length > 320 || password.length > 200) return null;
        // Only failed attempts count: 8 wrong passwords for one e-mail lock it for 15 minutes.
        if ((await remaining(signInLimiter(), email)) <= 0) throw new Error('TooManyAttempts');
        const user = await checkPassword(db, email, password);
        if (!user) {
          await take(signInLimiter(), email);
          return null;
        }
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
      if (user) token.uid = user.id;
      return token;
    },
    async session({ session, token }) {
      if (session.user) (session.user as { id?: string }).id = token.uid as string;
      return session;
    },
  },
};
