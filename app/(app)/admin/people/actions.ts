"use server";

import { randomBytes } from "node:crypto";
import { revalidatePath } from "next/cache";
import { z } from "zod";
import { insertUser, listOrganisations, listUsersForAdmin, setUserDisabled } from "@/db/queries/users";
import { requireRole } from "@/lib/auth/guards";
import { hashPassword } from "@/lib/auth/password";
import { sendPasswordLink } from "@/lib/auth/password-links";
import { ROLES } from "@/lib/auth/roles";

const inviteSchema = z.object({
  email: z.email("Enter a valid email address.").max(254),
  name: z.string().trim().min(2, "Enter the person's name.").max(120),
  role: z.enum(ROLES),
  organisationId: z.uuid("Pick an organisation."),
});

type InviteFields = keyof z.infer<typeof inviteSchema>;

/** `values` echoes what was typed, so a refused form keeps it after React resets the fields. */
export type InviteState = { ok: boolean; message: string; fieldErrors?: Partial<Record<InviteFields, string>>; values?: Partial<Record<InviteFields, string>> };

export async function inviteUser(_prev: InviteState, form: FormData): Promise<InviteState> {
  const admin = await requireRole("admin");
  const raw = Object.fromEntries(form);
  const values = Object.fromEntries(Object.entries(raw).map(([k, v]) => [k, typeof v === "string" ? v.slice(0, 254) : ""]));
  const parsed = inviteSchema.safeParse(raw);
  if (!parsed.success) {
    const fieldErrors: InviteState["fieldErrors"] = {};
    for (const issue of parsed.error.issues) fieldErrors[issue.path[0] as keyof typeof fieldErrors] ??= issue.message;
    return { ok: false, message: "Check the highlighted fields.", fieldErrors, values };
  }
  const org = (await listOrganisations()).find((o) => o.id === parsed.data.organisationId);
  if (!org) return { ok: false, message: "That organisation does not exist.", values };
  const clientRole = parsed.data.role === "manufacturer";
  if (clientRole !== (org.kind === "manufacturer")) {
    return { ok: false, message: clientRole ? "A client account belongs to a client organisation." : "Lab roles belong to the lab.", values };
  }
  if (org.kind === "lab" && org.id !== admin.organisationId) return { ok: false, message: "You can only invite people to your own lab.", values };
  let created;
  try {
    // An unusable random password until the invitee sets one through the mailed link.
    created = await insertUser({ ...parsed.data, passwordHash: await hashPassword(randomBytes(24).toString("hex")) });
  } catch {
    return { ok: false, message: "An account with that email already exists.", fieldErrors: { email: "Already in use." }, values };
  }
  if (!created) return { ok: false, message: "The account was not created." };
  await sendPasswordLink({ id: created.id, email: parsed.data.email, name: parsed.data.name }, "invite");
  revalidatePath("/admin/people");
  return { ok: true, message: `Invitation sent to ${parsed.data.email}.` };
}

const toggleSchema = z.object({ userId: z.uuid(), disable: z.enum(["true", "false"]) });

export async function toggleUser(form: FormData): Promise<void> {
  const admin = await requireRole("admin");
  const parsed = toggleSchema.safeParse(Object.fromEntries(form));
  if (!parsed.success || parsed.data.userId === admin.id) return;
  const target = (await listUsersForAdmin(admin.organisationId)).find((u) => u.id === parsed.data.userId);
  if (!target) return;
  await setUserDisabled(parsed.data.userId, parsed.data.disable === "true");
  revalidatePath("/admin/people");
}
