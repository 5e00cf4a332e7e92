import { listIdleCapturesAwaitingAnalysis, setCaptureState } from "@/db/queries/captures";
import { enqueueAnalysis, getAnalysisJobState, LIVE_JOB_STATES } from "@/lib/server/queue";

// The database is the source of truth: a capture waiting for analysis with no live job (Redis
// flushed or restored from an old snapshot, a crash between the row update and the enqueue)
// gets its job back. Stable job ids make a double enqueue harmless.

/** Captures younger than this are left alone: the web request that queued them may still be enqueueing. */
const IDLE_MS = 2_000;

export type SweepResult = { checked: number; requeued: number; markedFailed: number };

const PAGE = 500;

export async function sweepAbandonedCaptures(): Promise<SweepResult> {
  const result: SweepResult = { checked: 0, requeued: 0, markedFailed: 0 };
  // Paged by id, so a backlog of any size is checked in one sweep without holding it all.
  let afterId: string | undefined;
  for (;;) {
    const rows = await listIdleCapturesAwaitingAnalysis(IDLE_MS, PAGE, afterId);
    result.checked += rows.length;
    await checkPage(rows, result);
    if (rows.length < PAGE) return result;
    afterId = rows[rows.length - 1]?.captureId;
  }
}

async function checkPage(rows: Awaited<ReturnType<typeof listIdleCapturesAwaitingAnalysis>>, result: SweepResult): Promise<void> {
  for (const row of rows) {
    const job = await getAnalysisJobState(row.captureId);
    if (LIVE_JOB_STATES.has(job.state)) continue;
    if (job.state === "failed") {
      // The job gave up but never reached the processor's own bookkeeping (the child process died).
      const marked = await setCaptureState({ kind: "lab", labId: row.labId }, row.captureId, "failed", ["queued", "analysing"], {
        progress: 0,
        stateMessage: `Analysis failed: ${job.failedReason ?? "the worker stopped"}. It can be re-run once the cause is fixed.`,
      });
      if (marked) result.markedFailed++;
      continue;
    }
    await enqueueAnalysis({ captureId: row.captureId, labId: row.labId });
    result.requeued++;
  }
}
