import "server-only";
import { createHash, randomBytes } from "node:crypto";
import { insertPasswordToken } from "@/db/queries/password-tokens";
import { getEnv } from "@/lib/server/env";
import { sendMail } from "@/lib/server/mail";

const TTL_S = { invite: 7 * 24 * 3600, reset: 3600 } as const;

export function hashToken(token: string): string {
  return createHash("sha256").update(token).digest("hex");
}

/** Creates a one-time link and mails it. The token exists only in the mail. */
export async function sendPasswordLink(user: { id: string; email: string; name: string }, purpose: "invite" | "reset"): Promise<void> {
  const token = randomBytes(32).toString("base64url");
  await insertPasswordToken(user.id, purpose, hashToken(token), TTL_S[purpose]);
  const link = new URL(`/set-password?token=${token}`, getEnv().NEXTAUTH_URL).toString();
  const text =
    purpose === "invite"
      ? `Hello ${user.name},\n\nYou have been given an Emfolio account. Choose your password here (the link works once, for 7 days):\n\n${link}\n`
      : `Hello ${user.name},\n\nSomeone asked to reset your Emfolio password. If it was you, choose a new one here (the link works once, for 1 hour):\n\n${link}\n\nIf it was not you, ignore this message: your password stays as it is.\n`;
  await sendMail({ to: user.email, subject: purpose === "invite" ? "Your Emfolio account" : "Reset your Emfolio password", text });
}
