import { clearFailures, countRecentFailures, recordFailure } from "@/db/queries/sign-in-attempts";
import { findActiveUserByEmail } from "@/db/queries/users";
import { getEnv } from "@/lib/server/env";
import { verifyPassword } from "./password";
import { signInDelayMs } from "./sign-in-delay";

// Compared against when the account does not exist, so both paths cost one bcrypt check.
const DUMMY_HASH = "$2b$11$CwTycUXWue0Thq9StjUM0uJ8.9Cq2k1zZ6Qq7rWb8o6xjz3hYtY8e";

export type AuthResult =
  | { ok: true; user: { id: string; name: string; email: string; role: import("@/db/schema").Role; organisationId: string; organisationName: string; organisationKind: "lab" | "manufacturer"; sessionVersion: number } }
  | { ok: false; message: string };

const sleep = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));

/**
 * Checks a password. Failures slow down further attempts on the same account (a growing delay, never
 * a lock, so a stranger cannot lock anyone out); one client address is refused after
 * SIGN_IN_MAX_ATTEMPTS × 4 failures across accounts in the window.
 */
export async function authenticate(emailRaw: string, password: string, address: string): Promise<AuthResult> {
  const env = getEnv();
  const email = emailRaw.trim().toLowerCase();
  const failures = await countRecentFailures(email, address, env.SIGN_IN_WINDOW_S);
  const limit = env.SIGN_IN_MAX_ATTEMPTS;
  if (failures.byAddress >= limit * 4) {
    const minutes = Math.ceil(env.SIGN_IN_WINDOW_S / 60);
    return { ok: false, message: `Too many failed sign-in attempts from your address. Wait ${minutes} minutes and try again.` };
  }
  await sleep(signInDelayMs(failures.byEmail, limit));
  const row = await findActiveUserByEmail(email);
  const valid = await verifyPassword(password, row?.passwordHash ?? DUMMY_HASH);
  if (!row || !valid) {
    await recordFailure(email, address);
    return { ok: false, message: "That email and password do not match an active account." };
  }
  await clearFailures(email);
  const { passwordHash: _omit, ...user } = row;
  void _omit;
  return { ok: true, user };
}
