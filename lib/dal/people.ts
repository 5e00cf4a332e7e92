import "server-only";
import { randomBytes } from "node:crypto";
import { insertUser, listOrganisationsForLab, listUsersForAdmin, setUserDisabled } from "@/db/queries/users";
import type { Role } from "@/db/schema";
import { requireRole } from "@/lib/auth/guards";
import { hashPassword } from "@/lib/auth/password";
import { sendPasswordLink } from "@/lib/auth/password-links";
import { ROLE_LABELS } from "@/lib/auth/roles";

export async function getPeopleView() {
  const admin = await requireRole("admin");
  const [people, orgs] = await Promise.all([listUsersForAdmin(admin.organisationId), listOrganisationsForLab(admin.organisationId)]);
  return {
    selfId: admin.id,
    people,
    organisations: orgs.map((o) => ({ id: o.id, name: o.name, kind: o.kind })),
  };
}

export type Invitation = { email: string; name: string; role: Role; organisationId: string };
export type InviteOutcome = { ok: true } | { ok: false; message: string; field?: "email" };

/** A lab manager invites a person to their own lab or a client account to a client the lab is linked to. */
export async function invitePerson(input: Invitation): Promise<InviteOutcome> {
  const admin = await requireRole("admin");
  // Another lab, or a client this lab does not work for, reads the same as a missing one.
  const org = (await listOrganisationsForLab(admin.organisationId)).find((o) => o.id === input.organisationId);
  if (!org) return { ok: false, message: "That organisation does not exist or is not one of your lab's clients." };
  const clientRole = input.role === "manufacturer";
  if (clientRole !== (org.kind === "manufacturer")) {
    return { ok: false, message: clientRole ? "A client account belongs to a client organisation." : "Lab roles belong to the lab." };
  }
  if (org.kind === "lab" && org.id !== admin.organisationId) return { ok: false, message: "You can only invite people to your own lab." };
  let created;
  try {
    // An unusable random password until the invitee sets one through the mailed link.
    created = await insertUser({ ...input, passwordHash: await hashPassword(randomBytes(24).toString("hex")) });
  } catch {
    return { ok: false, message: "An account with that email already exists.", field: "email" };
  }
  if (!created) return { ok: false, message: "The account was not created." };
  await sendPasswordLink({ id: created.id, email: input.email, name: input.name }, "invite", {
    labId: admin.organisationId, labName: admin.organisationName, inviterName: admin.name, organisationName: org.name, roleLabel: ROLE_LABELS[input.role],
  });
  return { ok: true };
}

/** Disables or re-enables one of the lab manager's people (never themselves); false when not theirs. */
export async function setPersonDisabled(userId: string, disable: boolean): Promise<boolean> {
  const admin = await requireRole("admin");
  if (userId === admin.id) return false;
  const target = (await listUsersForAdmin(admin.organisationId)).find((u) => u.id === userId);
  if (!target) return false;
  await setUserDisabled(userId, disable);
  return true;
}
