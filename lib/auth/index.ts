import "server-only";
import NextAuth, { CredentialsSignin } from "next-auth";
import Credentials from "next-auth/providers/credentials";
import { cache } from "react";
import { clientAddress } from "@/lib/auth/client-address";
import { authConfig } from "@/lib/auth/config";
import { authSecret } from "@/lib/auth/secret";
import { credentialsSchema } from "@/lib/auth/schemas";
import { checkCredentials, endAllSessions } from "@/lib/people/sign-in";
import type { Role } from "@/lib/auth/roles";

declare module "next-auth" {
  interface User {
    role?: Role;
    sessionVersion?: number;
  }
}

class InvalidCredentials extends CredentialsSignin {
  code = "invalid_credentials";
}

// The configuration is built on first use so `next build` never needs AUTH_SECRET.
const nextAuth = NextAuth(() => ({
  ...authConfig,
  secret: authSecret(),
  providers: [
    Credentials({
      credentials: { email: { label: "E-mail", type: "email" }, password: { label: "Password", type: "password" } },
      async authorize(raw, request) {
        const parsed = credentialsSchema.safeParse(raw);
        if (!parsed.success) throw new InvalidCredentials();
        const address = clientAddress(request.headers);
        const result = await checkCredentials(parsed.data.email, parsed.data.password, address);
        if (!result.ok) throw new InvalidCredentials();
        const { user } = result;
        return { id: user.id, email: user.email, name: user.name, role: user.role, sessionVersion: user.sessionVersion };
      },
    }),
  ],
  events: {
    async signOut(message) {
      // Sign-out ends every session of this person at once: older cookies carry a stale version.
      const sub = "token" in message ? message.token?.sub : undefined;
      if (sub) await endAllSessions(sub);
    },
  },
}));

export const { handlers, signIn, signOut } = nextAuth;
export const auth = cache(nextAuth.auth);
