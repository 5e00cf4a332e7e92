import "server-only";
import { createHash, randomBytes } from "node:crypto";
import { senderLabNameFor } from "@/db/queries/mail-recipients";
import { insertPasswordToken } from "@/db/queries/password-tokens";
import { invitationMail, passwordResetMail } from "@/lib/mail/account-links";
import { getEnv } from "@/lib/server/env";
import { queueMail } from "@/lib/server/mail-outbox";

const TTL_S = { invite: 7 * 24 * 3600, reset: 3600 } as const;

export function hashToken(token: string): string {
  return createHash("sha256").update(token).digest("hex");
}

/** Who invited whom, to which organisation, with which role (named in the invitation). */
export type InvitationContext = { labId: string; labName: string; inviterName: string; organisationName: string; roleLabel: string };

type LinkUser = { id: string; email: string; name: string; organisationId?: string };

/** Creates a one-time link and queues its mail (the outbox job sends it). The token exists only in the mail. */
export async function sendPasswordLink(user: LinkUser, purpose: "invite" | "reset", invitation?: InvitationContext): Promise<void> {
  const token = randomBytes(32).toString("base64url");
  await insertPasswordToken(user.id, purpose, hashToken(token), TTL_S[purpose]);
  const link = new URL(`/set-password?token=${token}`, getEnv().NEXTAUTH_URL).toString();
  const labName = invitation?.labName ?? (user.organisationId ? await senderLabNameFor(user.organisationId).catch(() => undefined) : undefined) ?? "Emfolio";
  const mail = purpose === "invite" && invitation
    ? invitationMail({ inviteeName: user.name, inviterName: invitation.inviterName, organisationName: invitation.organisationName, roleLabel: invitation.roleLabel, labName, link })
    : purpose === "invite"
      ? invitationMail({ inviteeName: user.name, inviterName: labName, organisationName: labName, roleLabel: "member", labName, link })
      : passwordResetMail({ name: user.name, labName, link });
  await queueMail({
    labId: invitation?.labId ?? null, toUserId: user.id, toAddress: user.email, kind: purpose === "invite" ? "invitation" : "password-reset",
    subject: mail.subject, textBody: mail.text, htmlBody: mail.html, fromName: labName,
  });
}
