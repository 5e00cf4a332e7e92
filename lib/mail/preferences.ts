import { z } from "zod";
import type { NotificationPrefs, Role } from "@/db/schema";

// What each user receives by mail. Absent keys take these defaults; invitations and password links
// are always sent (they are what the user asked for or needs to sign in).

export type ResolvedPrefs = Required<NotificationPrefs>;

export function resolvePrefs(prefs: NotificationPrefs, role: Role): ResolvedPrefs {
  return {
    captureAlerts: prefs.captureAlerts ?? (role === "qa" ? "hourly" : "off"),
    reportNews: prefs.reportNews ?? role === "manufacturer",
    instrumentsDue: prefs.instrumentsDue ?? (role === "admin" || role === "qa"),
  };
}

const onOff = z.enum(["on", "off"], { error: "Choose on or off." });

/** The /account form: checkboxes arrive as "on" or are absent. */
export const notificationPrefsFormSchema = z.object({
  captureAlerts: z.enum(["off", "hourly", "daily-digest"], { error: "Choose no alerts, at most one per unit per hour, or a daily digest." }),
  reportNews: onOff.optional(),
  instrumentsDue: onOff.optional(),
});

export function prefsFromForm(form: z.infer<typeof notificationPrefsFormSchema>): ResolvedPrefs {
  return { captureAlerts: form.captureAlerts, reportNews: form.reportNews === "on", instrumentsDue: form.instrumentsDue === "on" };
}
