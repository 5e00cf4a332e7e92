import "server-only";
import { getNotificationPrefs, saveNotificationPrefs } from "@/db/queries/notification-prefs";
import { listUndeliveredMail } from "@/db/queries/mail-outbox";
import { requireRole, requireUser } from "@/lib/auth/guards";
import { resolvePrefs, type ResolvedPrefs } from "@/lib/mail/preferences";

export async function getMyNotificationPrefs(): Promise<{ prefs: ResolvedPrefs; role: string }> {
  const user = await requireUser();
  return { prefs: resolvePrefs(await getNotificationPrefs(user.id), user.role), role: user.role };
}

export async function saveMyNotificationPrefs(prefs: ResolvedPrefs): Promise<void> {
  const user = await requireUser();
  await saveNotificationPrefs(user.id, prefs);
}

/** For the lab manager: mails still waiting or failed, with the plain sentence of the last failure. */
export async function getUndeliveredMailView() {
  const admin = await requireRole("admin");
  return listUndeliveredMail(admin.organisationId);
}
