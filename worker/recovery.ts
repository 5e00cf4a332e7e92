import { listIdleCapturesAwaitingAnalysis, setCaptureState } from "@/db/queries/captures";
import { getEnv } from "@/lib/server/env";
import { logDetail } from "@/lib/server/outage";
import { enqueueAnalysis, getAnalysisJobState, LIVE_JOB_STATES } from "@/lib/server/queue";
import { failureMessage, isOutageReason } from "./processors/messages";

// The database is the source of truth: a capture waiting for analysis with no live job (Redis
// flushed or restarted empty, a crash between the row update and the enqueue, a job that gave up
// on an outage) gets its job back. Stable job ids make a double enqueue harmless.

/** Queued captures younger than this are left alone: the web request that queued them may still be enqueueing. */
const IDLE_MS = 2_000;

export type SweepResult = { checked: number; requeued: number; markedFailed: number; enqueueFailed: boolean };

const PAGE = 500;

/**
 * An analysing capture is only looked at once its row has not moved for the lock's length: a live
 * worker writes progress (or why it waits) far more often, so such a row's worker is gone.
 */
export async function sweepAbandonedCaptures(): Promise<SweepResult> {
  const result: SweepResult = { checked: 0, requeued: 0, markedFailed: 0, enqueueFailed: false };
  const analysingIdleMs = getEnv().WORKER_LOCK_MS;
  // Paged by id, so a backlog of any size is checked in one sweep without holding it all.
  let afterId: string | undefined;
  for (;;) {
    const rows = await listIdleCapturesAwaitingAnalysis(IDLE_MS, PAGE, afterId, analysingIdleMs);
    result.checked += rows.length;
    await checkPage(rows, result);
    if (rows.length < PAGE || result.enqueueFailed) return result;
    afterId = rows[rows.length - 1]?.captureId;
  }
}

async function checkPage(rows: Awaited<ReturnType<typeof listIdleCapturesAwaitingAnalysis>>, result: SweepResult): Promise<void> {
  for (const row of rows) {
    let job: Awaited<ReturnType<typeof getAnalysisJobState>>;
    try {
      job = await getAnalysisJobState(row.captureId);
      if (LIVE_JOB_STATES.has(job.state)) continue;
      if (job.state !== "failed" || isOutageReason(job.failedReason)) {
        await enqueueAnalysis({ captureId: row.captureId, labId: row.labId });
        result.requeued++;
        continue;
      }
    } catch (err) {
      // Redis is not answering: stop here; the worker sweeps again as soon as it reconnects.
      console.error(`sweep: could not check or enqueue ${row.captureId}: ${logDetail(err)}`);
      result.enqueueFailed = true;
      return;
    }
    // The job gave up but never reached the processor's own bookkeeping (the child process died).
    const marked = await setCaptureState({ kind: "lab", labId: row.labId }, row.captureId, "failed", ["queued", "analysing"], {
      progress: 0,
      stateMessage: failureMessage(new Error(job.failedReason ?? "the worker stopped"), 1, 1),
    });
    if (marked) result.markedFailed++;
  }
}
