import "server-only";
import { after } from "next/server";
import { recordResetRequest } from "@/db/queries/sign-in-attempts";
import { consumeTokenAndSetPassword, countRecentTokens, findUsablePasswordToken } from "@/db/queries/password-tokens";
import { findUserIdByEmail } from "@/db/queries/users";
import { hashPassword } from "@/lib/auth/password";
import { hashToken, sendPasswordLink } from "@/lib/auth/password-links";

/** Whose password a one-time link sets, or null when the link is unknown, used, expired or malformed. */
export async function getPasswordLinkView(token: string | undefined) {
  if (!token || token.length > 100) return null;
  return (await findUsablePasswordToken(hashToken(token))) ?? null;
}

const RESET_REQUESTS_PER_HOUR = 10;

/**
 * A forgot-password request from `address`: false when that address asked too often (10 an hour).
 * Otherwise the lookup and the mail run after the answer is sent (`after`), so an existing account
 * and an unknown one answer in the same time.
 */
export async function acceptPasswordResetRequest(email: string, address: string): Promise<boolean> {
  if ((await recordResetRequest(address, 3600)) > RESET_REQUESTS_PER_HOUR) return false;
  after(() => requestPasswordResetLink(email).catch((err: unknown) => console.error("password reset mail failed:", err instanceof Error ? err.message : err)));
  return true;
}

/** Mails a reset link when the address has an account; at most three links an hour per account. */
async function requestPasswordResetLink(email: string): Promise<void> {
  const user = await findUserIdByEmail(email);
  if (user && (await countRecentTokens(user.id, "reset", 3600)) < 3) {
    await sendPasswordLink({ id: user.id, email, name: user.name, organisationId: user.organisationId }, "reset");
  }
}

/** Uses a one-time link to set the password; false when the link is unknown, used or expired. */
export async function setPasswordWithLink(token: string, password: string): Promise<boolean> {
  return consumeTokenAndSetPassword(hashToken(token), await hashPassword(password));
}
