import Credentials from '@auth/core/providers/credentials';
import { defineConfig } from 'auth-astro';
import { signInSchema } from './src/lib/schemas/account';
import { getConfig } from './src/lib/server/config';
import { verifyAgainstDecoy, verifyPassword } from './src/lib/server/passwords';
import { findCredentials } from './src/lib/server/repos/users';
import { isSessionLive, newSessionId, revokeSession, SESSION_MAX_AGE_S } from './src/lib/server/session';
import { decodeSession, encodeSession } from './src/lib/server/session-jwt';

// Sign-in by e-mail and password; the session is a signed, encrypted JWT in an HttpOnly,
// SameSite=Lax cookie (Secure and __Secure- prefixed whenever the app is served over https).
export default defineConfig({
  secret: getConfig().authSecret,
  trustHost: true,
  session: { strategy: 'jwt', maxAge: SESSION_MAX_AGE_S },
  // Auth.js's token format, with the key derived once (session-jwt.ts).
  jwt: { encode: encodeSession, decode: decodeSession },
  pages: { signIn: '/sign-in', error: '/sign-in' },
  // A wrong password is an everyday event, counted by the sign-in throttle: not an error to log.
  logger: {
    error(error) {
      if (error.name !== 'CredentialsSignin') console.error(`[auth] ${error.name}: ${error.message}`);
    },
  },
  providers: [
    Credentials({
      credentials: { email: { label: 'E-mail' }, password: { label: 'Password', type: 'password' } },
      async authorize(credentials) {
        const parsed = signInSchema.safeParse(credentials);
        if (!parsed.success) return null;
        const found = await findCredentials(parsed.data.email);
        if (!found) return verifyAgainstDecoy(parsed.data.password).then(() => null);
        if (!(await verifyPassword(found.passwordHash, parsed.data.password))) return null;
        return { id: String(found.user.id), email: found.user.email, name: found.user.name };
      },
    }),
  ],
  // Each sign-in gets a session id kept in the token; signing out lists it as revoked, so a copy
  // of the cookie taken before is refused (returning null from `jwt` clears the session).
  events: {
    async signOut(message) {
      if ('token' in message && message.token) await revokeSession(message.token);
    },
  },
  callbacks: {
    async jwt({ token, user }) {
      if (user) return { ...token, sid: newSessionId() };
      return (await isSessionLive(token)) ? token : null;
    },
    session({ session, token }) {
      if (token.sub) session.user.id = token.sub;
      return session;
    },
  },
});
