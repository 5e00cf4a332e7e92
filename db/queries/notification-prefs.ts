import { eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { notificationPrefs, type NotificationPrefs } from "@/db/schema";

export async function getNotificationPrefs(userId: string): Promise<NotificationPrefs> {
  const rows = await getDb().select({ prefs: notificationPrefs.prefs }).from(notificationPrefs).where(eq(notificationPrefs.userId, userId)).limit(1);
  return rows[0]?.prefs ?? {};
}

export async function saveNotificationPrefs(userId: string, prefs: NotificationPrefs): Promise<void> {
  await getDb().insert(notificationPrefs).values({ userId, prefs, updatedAt: new Date() })
    .onConflictDoUpdate({ target: notificationPrefs.userId, set: { prefs, updatedAt: new Date() } });
}
