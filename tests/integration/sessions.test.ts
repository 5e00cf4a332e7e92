import { randomUUID } from "node:crypto";
import type { JWT } from "next-auth/jwt";
import type { Session, User } from "next-auth";
import { afterAll, describe, expect, it } from "vitest";
import { closeDb } from "@/db/queries/connection";
import { consumeTokenAndSetPassword, findUsablePasswordToken, insertPasswordToken } from "@/db/queries/password-tokens";
import { bumpSessionVersion, endOtherSessions } from "@/db/queries/sessions";
import { insertUser, setUserDisabled, setUserRole } from "@/db/queries/users";
import { DEMO_PASSWORD } from "@/db/seed-data";
import { seededOrgs } from "./helpers";
import { authenticate } from "@/lib/auth/authenticate";
import { authOptions } from "@/lib/auth/options";
import { hashPassword } from "@/lib/auth/password";
import { hashToken } from "@/lib/auth/password-links";

afterAll(closeDb);

// Drives next-auth's own callbacks the way a sign-in and each later request do: jwt() at sign-in,
// session() on every read of the session (getServerSession, /api/auth/session).
const callbacks = authOptions.callbacks as Required<NonNullable<typeof authOptions.callbacks>>;

async function signIn(email: string): Promise<JWT> {
  const result = await authenticate(email, DEMO_PASSWORD, `s-${randomUUID()}`);
  if (!result.ok) throw new Error(result.message);
  const token = { name: result.user.name, email: result.user.email } as JWT;
  return (await callbacks.jwt({ token, user: result.user as User, account: null, trigger: "signIn" })) as JWT;
}

async function read(token: JWT): Promise<Session["user"] | undefined> {
  const session = (await callbacks.session({ session: { expires: "" } as Session, token, user: undefined as never, newSession: undefined, trigger: "update" })) as Session;
  return session.user;
}

async function freshUser(tag: string) {
  const { lab } = await seededOrgs();
  const email = `session-${tag}-${randomUUID()}@harrowgate.example`;
  const created = await insertUser({ email, name: `Session ${tag}`, role: "operator", organisationId: lab.id, passwordHash: await hashPassword(DEMO_PASSWORD) });
  if (!created) throw new Error("user not created");
  return { id: created.id, email };
}

describe("authOptions.callbacks.session(token) re-checks the account on every request", () => {
  it("session of a live token reads role and organisation from the database", async () => {
    const u = await freshUser("live");
    const token = await signIn(u.email);
    const user = await read(token);
    expect(user?.id).toBe(u.id);
    expect(user?.role).toBe("operator");
    expect(user?.sessionId).toBe(token.sid);
  });

  it("session after the account is disabled reads as signed out, and stays so when re-enabled", async () => {
    const u = await freshUser("disable");
    const token = await signIn(u.email);
    await setUserDisabled(u.id, true);
    expect(await read(token)).toBeUndefined();
    await setUserDisabled(u.id, false);
    expect(await read(token)).toBeUndefined();
  });

  it("session after a role change reads as signed out", async () => {
    const u = await freshUser("role");
    const token = await signIn(u.email);
    await setUserRole(u.id, "qa");
    expect(await read(token)).toBeUndefined();
    expect((await read(await signIn(u.email)))?.role).toBe("qa");
  });

  it("session from before a password reset reads as signed out, and every other link of the user ends", async () => {
    const u = await freshUser("reset");
    const token = await signIn(u.email);
    const [a, b] = [randomUUID(), randomUUID()];
    await insertPasswordToken(u.id, "reset", hashToken(a), 3600);
    await insertPasswordToken(u.id, "reset", hashToken(b), 3600);
    expect(await consumeTokenAndSetPassword(hashToken(b), await hashPassword(DEMO_PASSWORD))).toBe(true);
    expect(await read(token)).toBeUndefined();
    expect(await findUsablePasswordToken(hashToken(a))).toBeUndefined();
    expect(await consumeTokenAndSetPassword(hashToken(a), await hashPassword("another-password-1"))).toBe(false);
  });

  it("session of a signed-out token reads as signed out (a replayed cookie is refused); other sessions stay", async () => {
    const u = await freshUser("signout");
    const first = await signIn(u.email);
    const second = await signIn(u.email);
    await authOptions.events?.signOut?.({ token: first, session: undefined as never });
    expect(await read(first)).toBeUndefined();
    expect((await read(second))?.id).toBe(u.id);
  });

  it("endOtherSessions keeps this session and ends the others; bumpSessionVersion ends them all", async () => {
    const u = await freshUser("others");
    const here = await signIn(u.email);
    const there = await signIn(u.email);
    const third = await signIn(u.email);
    expect(await endOtherSessions(u.id, here.sid ?? "")).toBe(2);
    expect((await read(here))?.id).toBe(u.id);
    expect(await read(there)).toBeUndefined();
    expect(await read(third)).toBeUndefined();
    await bumpSessionVersion(u.id);
    expect(await read(here)).toBeUndefined();
  });

  it("session of a token without a session id (issued before sessions were recorded) reads as signed out", async () => {
    const token = await signIn("tobiah.crane@harrowgate.example");
    expect(await read({ ...token, sid: undefined })).toBeUndefined();
    expect(await read({ ...token, sid: randomUUID() })).toBeUndefined();
  });
});
