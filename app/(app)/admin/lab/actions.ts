"use server";

import { revalidatePath } from "next/cache";
import { requireRoleActor } from "@/lib/dal/actor";
import { labSettingsSchema, saveLabSettings } from "@/lib/dal/lab-settings";
import { InputError } from "@/lib/dal/setup-access";
import { fieldErrorsOf } from "@/lib/ratings/field-errors";
import { asForm } from "@/lib/forms/fields";

export type LabSettingsState = { ok: boolean; message: string; fields?: Record<string, string>; values?: Record<string, string> };

export async function saveLabSettingsAction(_prev: LabSettingsState, form: FormData): Promise<LabSettingsState> {
  const actor = await requireRoleActor("admin");
  form = asForm(form);
  const raw = Object.fromEntries([...form.entries()].map(([k, v]) => [k, String(v)]));
  const parsed = labSettingsSchema.safeParse(raw);
  if (!parsed.success) return { ok: false, message: "Check the fields marked below.", fields: fieldErrorsOf(parsed.error), values: raw };
  try {
    await saveLabSettings(actor, parsed.data);
  } catch (err) {
    if (err instanceof InputError) return { ok: false, message: "Check the fields marked below.", fields: err.fields, values: raw };
    throw err;
  }
  revalidatePath("/admin/lab");
  return { ok: true, message: "Saved. The next released report takes the number shown." };
}
