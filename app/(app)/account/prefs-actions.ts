"use server";

import { revalidatePath } from "next/cache";
import { redirect } from "next/navigation";
import { requireUser } from "@/lib/auth/guards";
import { saveMyNotificationPrefs } from "@/lib/dal/notification-prefs";
import { notificationPrefsFormSchema, prefsFromForm } from "@/lib/mail/preferences";
import { asForm } from "@/lib/forms/fields";

export async function saveNotificationPrefsAction(form: FormData): Promise<void> {
  await requireUser();
  form = asForm(form);
  const parsed = notificationPrefsFormSchema.safeParse(Object.fromEntries(form));
  if (!parsed.success) redirect(`/account?prefs=${encodeURIComponent(parsed.error.issues[0]?.message ?? "Check the form.")}`);
  await saveMyNotificationPrefs(prefsFromForm(parsed.data));
  revalidatePath("/account");
  redirect("/account?prefs=saved");
}
