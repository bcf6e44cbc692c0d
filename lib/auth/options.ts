import 'server-only';
import type { NextAuthOptions } from 'next-auth';
import CredentialsProvider from 'next-auth/providers/credentials';
import { verifyCredentials } from '@/lib/auth/credentials';
import { env } from '@/lib/env';

export const authOptions: NextAuthOptions = {
  secret: env().AUTH_SECRET,
  session: { strategy: 'jwt', maxAge: 12 * 60 * 60 },
  pages: { signIn: '/signin', error: '/signin' },
  logger: {
    // next-auth logs request bodies on some errors; keep credentials out of the log.
    error: (code) => console.error(`[auth] ${code}`),
    warn: (code) => console.warn(`[auth] ${code}`),
    debug: () => {},
  },
  providers: [
    CredentialsProvider({
      name: 'E-mail and password',
      credentials: { email: { label: 'E-mail', type: 'email' }, password: { label: 'Password', type: 'password' } },
      async authorize(credentials) {
        const result = await verifyCredentials(credentials?.email ?? '', credentials?.password ?? '');
        if (!result.ok) throw new Error(result.message);
        const u = result.user;
        return { id: u.id, email: u.email, name: u.name, role: u.role, organisationId: u.organisationId, orgKind: u.orgKind };
      },
    }),
  ],
  callbacks: {
    jwt({ token, user }) {
      if (user) {
        token.uid = user.id;
        token.role = user.role;
        token.organisationId = user.organisationId;
        token.orgKind = user.orgKind;
      }
      return token;
    },
    session({ session, token }) {
      session.user = {
        id: token.uid,
        name: token.name ?? '',
        email: token.email ?? '',
        role: token.role,
        organisationId: token.organisationId,
        orgKind: token.orgKind,
      };
      return session;
    },
  },
};
