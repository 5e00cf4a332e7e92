import { queueDailyCaptureDigests } from "@/lib/server/mail-capture-alerts";
import { sweepStrandedMail } from "@/lib/server/mail-delivery";

// Part of the worker's sweep: queued mails whose job was lost get one again; yesterday's capture
// digests are queued once (their dedupe key names the day, so a second sweep adds nothing).

export async function sweepMail(reason: string, log: (line: string) => void): Promise<void> {
  try {
    const r = await sweepStrandedMail();
    if (r.requeued) log(`sweep (${reason}): ${r.requeued} queued mail(s) given a job again`);
    const d = await queueDailyCaptureDigests(new Date());
    if (d.queued) log(`sweep (${reason}): ${d.queued} daily capture digest(s) queued`);
  } catch (err) {
    console.error(`sweep (${reason}): mail housekeeping failed: ${err instanceof Error ? err.message.split("\n")[0] : String(err)}`);
  }
}

/** The outbox ids an analysis job returned (capture alerts its child process wrote). */
export function mailIdsOf(result: unknown): string[] {
  const ids = (result as { mailIds?: unknown } | null)?.mailIds;
  return Array.isArray(ids) ? ids.filter((id): id is string => typeof id === "string") : [];
}
