import { listInstrumentsDueBetween, listLabManagers } from "@/db/queries/instruments";
import { insertQueuedMail } from "@/db/queries/mail-outbox";
import { addDays, REMINDER_DAYS } from "@/lib/instruments/status";
import { INSTRUMENT_KIND_LABELS } from "@/lib/instruments/input-schemas";

// Once a day the worker queues a reminder to each lab manager for every instrument whose calibration
// falls due within REMINDER_DAYS. The dedupe key (instrument, due date, recipient) makes it one mail per
// due date however often the sweep runs; a new due date (after recalibration) is reminded afresh.
// The outbox sender delivers it.

export const reminderKey = (instrumentId: string, due: string, userId: string) => `calibration-due:${instrumentId}:${due}:${userId}`;

export async function queueCalibrationReminders(today: string, appUrl: string): Promise<number> {
  let queued = 0;
  const due = await listInstrumentsDueBetween(today, addDays(today, REMINDER_DAYS));
  const managers = new Map<string, Awaited<ReturnType<typeof listLabManagers>>>();
  for (const { instrument: i } of due) {
    if (!i.calibrationDue) continue;
    if (!managers.has(i.labId)) managers.set(i.labId, await listLabManagers(i.labId));
    const what = `${INSTRUMENT_KIND_LABELS[i.kind]} ${i.assetTag} (${i.make} ${i.model}, serial ${i.serial})`;
    const link = `${appUrl.replace(/\/$/, "")}/admin/instruments/${i.id}`;
    for (const m of managers.get(i.labId) ?? []) {
      const text = `${what} is due for calibration on ${i.calibrationDue}.\n\nCaptures uploaded after that date carry a warning and need a quality engineer's confirmation before release.\n\nRegister entry: ${link}\n`;
      const id = await insertQueuedMail({
        labId: i.labId, toUserId: m.id, toAddress: m.email, kind: "calibration-due", fromName: "Emfolio",
        subject: `Calibration due ${i.calibrationDue}: ${i.assetTag}`, textBody: text,
        htmlBody: `<p>${escapeHtml(what)} is due for calibration on <strong>${i.calibrationDue}</strong>.</p><p>Captures uploaded after that date carry a warning and need a quality engineer's confirmation before release.</p><p><a href="${escapeHtml(link)}">Register entry</a></p>`,
        dedupeKey: reminderKey(i.id, i.calibrationDue, m.id),
      });
      if (id) queued++;
    }
  }
  return queued;
}

const escapeHtml = (s: string) => s.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);
