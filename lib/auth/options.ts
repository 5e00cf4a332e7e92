import type { NextAuthOptions, Session } from "next-auth";
import { endSession, findLiveSessionUser, insertSession } from "@/db/queries/sessions";
import CredentialsModule from "next-auth/providers/credentials";
import { z } from "zod";
import type { Role } from "@/db/schema";
import { authenticate } from "./authenticate";
import { clientAddressFrom } from "./client-address";
import { safeRedirectPath } from "./redirect-target";

// next-auth 4 ships CommonJS: Node scripts see the module object where the bundler sees the function.
const CredentialsProvider =
  (CredentialsModule as unknown as { default?: typeof CredentialsModule }).default ?? CredentialsModule;

export const credentialsSchema = z.object({
  email: z.email().max(254),
  password: z.string().min(1).max(200),
});


/** A session lasts one working shift at most; sign-out, a password change or a disable end it sooner. */
export const SESSION_TTL_S = 8 * 60 * 60;

export const authOptions: NextAuthOptions = {
  session: { strategy: "jwt", maxAge: SESSION_TTL_S },
  pages: { signIn: "/sign-in", error: "/sign-in" },
  providers: [
    CredentialsProvider({
      name: "Email and password",
      credentials: { email: { label: "Email", type: "email" }, password: { label: "Password", type: "password" } },
      async authorize(raw, req) {
        const parsed = credentialsSchema.safeParse(raw);
        if (!parsed.success) throw new Error("Enter an email address and a password.");
        const result = await authenticate(parsed.data.email, parsed.data.password, clientAddressFrom(req?.headers));
        if (!result.ok) throw new Error(result.message);
        return result.user;
      },
    }),
  ],
  callbacks: {
    // next-auth's callbackUrl: only this app's own paths (lib/auth/redirect-target.ts).
    redirect({ url, baseUrl }) {
      return new URL(safeRedirectPath(url, baseUrl), baseUrl).toString();
    },
    async jwt({ token, user }) {
      if (user) {
        token.sid = await insertSession(user.id, SESSION_TTL_S);
        token.sv = user.sessionVersion;
        token.uid = user.id;
        token.role = user.role;
        token.orgId = user.organisationId;
        token.orgName = user.organisationName;
        token.orgKind = user.organisationKind;
      }
      return token;
    },
    // Every read of the session re-checks the account: an ended session, a disabled account or a
    // bumped session_version (password change, role change, sign out everywhere) reads as signed out.
    // Role and organisation come from the database, not from the token.
    async session({ session, token }) {
      const live = token.sid && token.uid ? await findLiveSessionUser(token.sid, token.uid, token.sv ?? -1) : undefined;
      if (!live) return { expires: session.expires } as Session;
      session.user = { ...live, sessionId: token.sid };
      return session;
    },
  },
  events: {
    // Sign-out ends this token's session on the server: a copy of the cookie replayed later is refused.
    async signOut({ token }) {
      if (token?.sid) await endSession(token.sid);
    },
  },
};

export type SessionUser = {
  id: string; name: string; email: string; role: Role;
  organisationId: string; organisationName: string; organisationKind: "lab" | "manufacturer";
  /** The user_sessions row of this sign-in (absent for actors made by trusted scripts). */
  sessionId?: string;
};
