"use server";

import { revalidatePath } from "next/cache";
import { z } from "zod";
import { requireRole } from "@/lib/auth/guards";
import { ROLES } from "@/lib/auth/roles";
import { invitePerson, setPersonDisabled } from "@/lib/dal/people";
import { asForm } from "@/lib/forms/fields";

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
  form = asForm(form);
  await requireRole("admin");
  const raw = Object.fromEntries(form);
  const values = Object.fromEntries(Object.entries(raw).map(([k, v]) => [k, typeof v === "string" ? v.slice(0, 254) : ""]));
  const parsed = inviteSchema.safeParse(raw);
  if (!parsed.success) {
    const fieldErrors: InviteState["fieldErrors"] = {};
    for (const issue of parsed.error.issues) fieldErrors[issue.path[0] as keyof typeof fieldErrors] ??= issue.message;
    return { ok: false, message: "Check the highlighted fields.", fieldErrors, values };
  }
  const outcome = await invitePerson(parsed.data);
  if (!outcome.ok) return { ok: false, message: outcome.message, fieldErrors: outcome.field ? { email: "Already in use." } : undefined, values };
  revalidatePath("/admin/people");
  return { ok: true, message: `Invitation sent to ${parsed.data.email}.` };
}

const toggleSchema = z.object({ userId: z.uuid(), disable: z.enum(["true", "false"]) });

export async function toggleUser(form: FormData): Promise<void> {
  form = asForm(form);
  await requireRole("admin");
  const parsed = toggleSchema.safeParse(Object.fromEntries(form));
  if (!parsed.success) return;
  if (!(await setPersonDisabled(parsed.data.userId, parsed.data.disable === "true"))) return;
  revalidatePath("/admin/people");
}
