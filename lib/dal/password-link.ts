import "server-only";
import { findUsablePasswordToken } from "@/db/queries/password-tokens";
import { hashToken } from "@/lib/auth/password-links";

/** Whose password a one-time link sets, or null when the link is unknown, used, expired or malformed. */
export async function getPasswordLinkView(token: string | undefined) {
  if (!token || token.length > 100) return null;
  return (await findUsablePasswordToken(hashToken(token))) ?? null;
}
