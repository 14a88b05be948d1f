import { authRoute } from '@/lib/auth/nextauth-route';

// next-auth, fenced so junk gets a 4xx and callback URLs stay on this site (lib/auth/nextauth-route.ts).
export { authRoute as GET, authRoute as POST };
