import type { NextAuthOptions } from "next-auth";
import CredentialsModule from "next-auth/providers/credentials";
import { z } from "zod";
import type { Role } from "@/db/schema";
import { authenticate } from "./authenticate";
import { safeRedirectPath } from "./redirect-target";

// next-auth 4 ships CommonJS: Node scripts see the module object where the bundler sees the function.
const CredentialsProvider =
  (CredentialsModule as unknown as { default?: typeof CredentialsModule }).default ?? CredentialsModule;

export const credentialsSchema = z.object({
  email: z.email().max(254),
  password: z.string().min(1).max(200),
});

function clientAddress(headers: Record<string, unknown> | undefined): string {
  const forwarded = headers?.["x-forwarded-for"];
  const first = typeof forwarded === "string" ? forwarded.split(",")[0]?.trim() : undefined;
  const real = headers?.["x-real-ip"];
  return first || (typeof real === "string" ? real : "") || "unknown";
}

export const authOptions: NextAuthOptions = {
  session: { strategy: "jwt", maxAge: 12 * 60 * 60 },
  pages: { signIn: "/sign-in", error: "/sign-in" },
  providers: [
    CredentialsProvider({
      name: "Email and password",
      credentials: { email: { label: "Email", type: "email" }, password: { label: "Password", type: "password" } },
      async authorize(raw, req) {
        const parsed = credentialsSchema.safeParse(raw);
        if (!parsed.success) throw new Error("Enter an email address and a password.");
        const result = await authenticate(parsed.data.email, parsed.data.password, clientAddress(req?.headers));
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
    jwt({ token, user }) {
      if (user) {
        token.uid = user.id;
        token.role = user.role;
        token.orgId = user.organisationId;
        token.orgName = user.organisationName;
        token.orgKind = user.organisationKind;
      }
      return token;
    },
    session({ session, token }) {
      session.user = {
        id: token.uid, name: token.name ?? "", email: token.email ?? "", role: token.role,
        organisationId: token.orgId, organisationName: token.orgName, organisationKind: token.orgKind,
      };
      return session;
    },
  },
};

export type SessionUser = {
  id: string; name: string; email: string; role: Role;
  organisationId: string; organisationName: string; organisationKind: "lab" | "manufacturer";
};
