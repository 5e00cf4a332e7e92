import "server-only";
import { consumeTokenAndSetPassword, countRecentTokens, findUsablePasswordToken } from "@/db/queries/password-tokens";
import { findUserIdByEmail } from "@/db/queries/users";
import { hashPassword } from "@/lib/auth/password";
import { hashToken, sendPasswordLink } from "@/lib/auth/password-links";

/** Whose password a one-time link sets, or null when the link is unknown, used, expired or malformed. */
export async function getPasswordLinkView(token: string | undefined) {
  if (!token || token.length > 100) return null;
  return (await findUsablePasswordToken(hashToken(token))) ?? null;
}

/** Mails a reset link when the address has an account; at most three links an hour per account. */
export async function requestPasswordResetLink(email: string): Promise<void> {
  const user = await findUserIdByEmail(email);
  if (user && (await countRecentTokens(user.id, "reset", 3600)) < 3) {
    await sendPasswordLink({ id: user.id, email, name: user.name }, "reset");
  }
}

/** Uses a one-time link to set the password; false when the link is unknown, used or expired. */
export async function setPasswordWithLink(token: string, password: string): Promise<boolean> {
  return consumeTokenAndSetPassword(hashToken(token), await hashPassword(password));
}
