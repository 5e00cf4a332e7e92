import { captureAlertFacts, listAlertingCaptures, listLabQualityEngineers, listLabsWithDigestReaders, organisationName } from "@/db/queries/mail-recipients";
import type { NotificationPrefs } from "@/db/schema";
import { captureAlertMail, captureDigestMail } from "@/lib/mail/capture-alerts";
import { resolvePrefs } from "@/lib/mail/preferences";
import { getEnv } from "./env";
import { queueMail } from "./mail-outbox";

/** The hour a capture alert belongs to (UTC): the dedupe key allows one mail per unit, user and hour. */
export function alertHour(at: Date): string {
  return at.toISOString().slice(0, 13);
}

/**
 * After the worker stored a result: when it ended outside tolerance or inconclusive, queue an alert to
 * each quality engineer of the lab who chose hourly alerts, at most one per unit per hour. Never throws.
 */
export async function alertOnCaptureResult(
  labId: string, captureId: string, options: { now?: Date; enqueue?: boolean } = {},
): Promise<{ queued: number; ids: string[] }> {
  const now = options.now ?? new Date();
  const ids: string[] = [];
  try {
    const facts = await captureAlertFacts(labId, captureId);
    if (!facts || (facts.overall !== "fail" && facts.overall !== "inconclusive")) return { queued: 0, ids };
    const overall = facts.overall;
    const link = new URL(`/captures/${facts.captureId}`, getEnv().NEXTAUTH_URL).toString();
    let queued = 0;
    for (const reader of await listLabQualityEngineers(labId)) {
      if (resolvePrefs((reader.prefs ?? {}) as NotificationPrefs, reader.role).captureAlerts !== "hourly") continue;
      const mail = captureAlertMail({ readerName: reader.name, labName: facts.labName, serial: facts.serial, modelCode: facts.modelCode, fileName: facts.fileName, overall, link });
      const outcome = await queueMail({
        labId, toUserId: reader.id, toAddress: reader.email, kind: "capture-alert", subject: mail.subject, textBody: mail.text,
        htmlBody: mail.html, fromName: facts.labName, dedupeKey: `capture-alert:${facts.unitId}:${reader.id}:${alertHour(now)}`,
      }, { enqueue: options.enqueue, ids });
      if (outcome === "queued") queued += 1;
    }
    return { queued, ids };
  } catch (err) {
    console.error(`capture ${captureId}: alert not queued: ${err instanceof Error ? err.message.split("\n")[0] : String(err)}`);
    return { queued: 0, ids };
  }
}

/** Queues yesterday's (UTC) digest for each engineer who chose one; a day with nothing to say sends nothing. */
export async function queueDailyCaptureDigests(now: Date): Promise<{ queued: number }> {
  const today = new Date(Date.UTC(now.getUTCFullYear(), now.getUTCMonth(), now.getUTCDate()));
  const yesterday = new Date(today.getTime() - 86_400_000);
  const day = yesterday.toISOString().slice(0, 10);
  let queued = 0;
  for (const labId of await listLabsWithDigestReaders()) {
    const lines = (await listAlertingCaptures(labId, yesterday, today))
      .flatMap((l) => (l.overall === "fail" || l.overall === "inconclusive" ? [{ serial: l.serial, fileName: l.fileName, overall: l.overall }] : []));
    if (lines.length === 0) continue;
    const labName = (await organisationName(labId)) ?? "Emfolio";
    const link = new URL("/review", getEnv().NEXTAUTH_URL).toString();
    for (const reader of await listLabQualityEngineers(labId)) {
      if (resolvePrefs((reader.prefs ?? {}) as NotificationPrefs, reader.role).captureAlerts !== "daily-digest") continue;
      const mail = captureDigestMail({ readerName: reader.name, labName, day, lines, link });
      const outcome = await queueMail({
        labId, toUserId: reader.id, toAddress: reader.email, kind: "capture-digest", subject: mail.subject, textBody: mail.text,
        htmlBody: mail.html, fromName: labName, dedupeKey: `capture-digest:${reader.id}:${day}`,
      });
      if (outcome === "queued") queued += 1;
    }
  }
  return { queued };
}
