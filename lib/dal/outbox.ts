import "server-only";
import { listUsersForAdmin } from "@/db/queries/users";
import { requireRole } from "@/lib/auth/guards";
import { listOutbox, type StoredMail } from "@/lib/server/outbox";

/**
 * The local outbox as a lab manager may read it: only messages to people they manage (their lab's
 * staff and their clients' users). The mail catcher's folder is shared by every lab of the instance.
 */
export async function getOutboxView(limit = 100): Promise<StoredMail[]> {
  const admin = await requireRole("admin");
  const managed = new Set((await listUsersForAdmin(admin.organisationId)).map((u) => u.email.toLowerCase()));
  const mails = await listOutbox(1000);
  return mails.filter((m) => m.to.length > 0 && m.to.every((to) => managed.has(to.trim().toLowerCase()))).slice(0, limit);
}
