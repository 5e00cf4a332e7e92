import { composeMail, type ComposedMail } from "./compose";

// Invitation and password-reset mails. The link carries a one-time token that exists only in the mail.

export type InvitationFacts = {
  inviteeName: string; inviterName: string; organisationName: string; roleLabel: string; labName: string; link: string;
};

export function invitationMail(f: InvitationFacts): ComposedMail {
  return composeMail({
    subject: `${f.inviterName} invited you to Emfolio (${f.organisationName})`,
    greeting: `Hello ${f.inviteeName},`,
    paragraphs: [
      `${f.inviterName} of ${f.labName} has given you an Emfolio account for ${f.organisationName}, with the role "${f.roleLabel}".`,
      "Choose your password with the link below. It works once, for 7 days.",
    ],
    link: { label: "Choose your password", url: f.link },
    footer: `If you did not expect this invitation, ignore this mail or tell ${f.labName}; without a password the account cannot be used.`,
  });
}

export function passwordResetMail(f: { name: string; labName: string; link: string }): ComposedMail {
  return composeMail({
    subject: "Reset your Emfolio password",
    greeting: `Hello ${f.name},`,
    paragraphs: ["Someone asked to reset your Emfolio password. If it was you, choose a new one with the link below (it works once, for 1 hour)."],
    link: { label: "Choose a new password", url: f.link },
    footer: "If it was not you, ignore this mail: your password stays as it is.",
  });
}
