"use server";

import { revalidatePath } from "next/cache";
import { HttpError } from "@/lib/auth/guards";
import { requireRoleActor } from "@/lib/dal/actor";
import { importProfileEditSchema, importProfileRemoveSchema } from "@/lib/captures/import-profile";
import { editImportProfile, removeImportProfile } from "@/lib/dal/import-profiles";
import { asForm } from "@/lib/forms/fields";

export type ProfileState = { ok: boolean; message: string };

export async function editProfileAction(_prev: ProfileState, form: FormData): Promise<ProfileState> {
  form = asForm(form);
  await requireRoleActor("admin", "operator");
  const parsed = importProfileEditSchema.safeParse(Object.fromEntries(form));
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    return { ok: false, message: issue ? `${issue.path.slice(1).join(".") || "settings"}: ${issue.message}` : "Check the settings." };
  }
  try {
    await editImportProfile(parsed.data.profileId, parsed.data.settings);
  } catch (err) {
    return { ok: false, message: err instanceof HttpError ? err.message : "The profile was not saved." };
  }
  revalidatePath("/stations");
  return { ok: true, message: "Profile saved." };
}

export async function removeProfileAction(form: FormData): Promise<void> {
  form = asForm(form);
  await requireRoleActor("admin", "operator");
  const parsed = importProfileRemoveSchema.safeParse(Object.fromEntries(form));
  if (!parsed.success) return;
  await removeImportProfile(parsed.data.profileId).catch((err: unknown) => {
    if (!(err instanceof HttpError)) throw err;
  });
  revalidatePath("/stations");
}
