import { listClientUsers, reportMailFacts } from "@/db/queries/mail-recipients";
import type { NotificationPrefs } from "@/db/schema";
import { resolvePrefs } from "@/lib/mail/preferences";
import { reportNewsMail, type ReportEvent } from "@/lib/mail/report-news";
import { getEnv } from "./env";
import { queueMail } from "./mail-outbox";

/**
 * Tells the client's users that one of their reports was released, superseded or withdrawn (each user
 * who keeps "report news" on). Call it after the change is committed; it never throws, so a mail
 * problem never undoes or blocks a release. One mail per report, event and user (dedupe key).
 */
export async function notifyReportEvent(reportId: string, event: ReportEvent): Promise<{ queued: number }> {
  try {
    const facts = await reportMailFacts(reportId);
    if (!facts) return { queued: 0 };
    const readers = await listClientUsers(facts.clientId);
    const link = new URL(`/portal?serial=${encodeURIComponent(facts.serial)}`, getEnv().NEXTAUTH_URL).toString();
    const reason = event === "withdrawn" ? facts.withdrawReason : event === "released" && facts.revision > 1 ? facts.reason : null;
    let queued = 0;
    for (const reader of readers) {
      if (!resolvePrefs((reader.prefs ?? {}) as NotificationPrefs, reader.role).reportNews) continue;
      const mail = reportNewsMail({
        event, readerName: reader.name, labName: facts.labName, number: facts.number, revision: facts.revision,
        serial: facts.serial, modelCode: facts.modelCode, reason: reason || null, link,
      });
      const outcome = await queueMail({
        labId: facts.labId, toUserId: reader.id, toAddress: reader.email, kind: `report-${event}`, subject: mail.subject,
        textBody: mail.text, htmlBody: mail.html, fromName: facts.labName, dedupeKey: `report:${reportId}:${event}:${reader.id}`,
      });
      if (outcome === "queued") queued += 1;
    }
    return { queued };
  } catch (err) {
    console.error(`report ${reportId} ${event}: mails not queued: ${err instanceof Error ? err.message.split("\n")[0] : String(err)}`);
    return { queued: 0 };
  }
}
