import type { NextAuthConfig } from "next-auth";
import type { Role } from "@/lib/auth/roles";

/** Session lifetime: a working day and a bit; after it people sign in again. */
const SESSION_MAX_AGE_SECONDS = 12 * 60 * 60;

/**
 * Database-free part of the Auth.js configuration, shared by proxy.ts and lib/auth/index.ts.
 * proxy.ts only redirects signed-out visitors; every handler and action checks for itself.
 */
export const authConfig = {
  pages: { signIn: "/login" },
  session: { strategy: "jwt", maxAge: SESSION_MAX_AGE_SECONDS },
  trustHost: true,
  providers: [],
  callbacks: {
    authorized({ auth }) {
      return Boolean(auth?.user);
    },
    jwt({ token, user }) {
      if (user) {
        const u = user as { id?: string; role?: Role; sessionVersion?: number };
        token.sub = u.id;
        token.role = u.role;
        token.sv = u.sessionVersion ?? 0;
      }
      return token;
    },
    session({ session, token }) {
      if (session.user) {
        session.user.id = token.sub ?? "";
        (session.user as { role?: Role }).role = token.role as Role | undefined;
      }
      return session;
    },
  },
} satisfies NextAuthConfig;
