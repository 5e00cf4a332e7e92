import type { Role } from "@/db/schema";

declare module "next-auth" {
  interface Session {
    user: import("./options").SessionUser;
  }
  interface User {
    id: string; role: Role; organisationId: string; organisationName: string; organisationKind: "lab" | "manufacturer"; sessionVersion: number;
  }
}

declare module "next-auth/jwt" {
  interface JWT {
    uid: string; role: Role; orgId: string; orgName: string; orgKind: "lab" | "manufacturer";
    /** user_sessions id and the user's session_version at sign-in. */
    sid?: string; sv?: number;
  }
}
