import { UnrecoverableError, type SandboxedJob } from "bullmq";
import { isCaptureRejection } from "@/lib/analysis";
import { recordAnalysis } from "@/db/queries/analyses";
import { claimCaptureForAnalysis, setCaptureProgress, setCaptureState } from "@/db/queries/captures";
import type { Scope } from "@/db/queries/scope";
import type { AnalysisJobData } from "@/lib/server/queue";
import { refreshUnitPlanState } from "@/db/queries/unit-plan";
import { ConfigurationProblem, loadJudgement } from "@/lib/server/judgement";
import { runAnalysis } from "./run-analysis";

// Runs in a sandboxed child process (see worker/index.ts), so parsing and analysis never block
// the parent's lock renewal. The job carries ids only; everything else is read from the database.

const PROGRESS_EVERY_MS = 500;

// A forked child outliving its worker would finish jobs nobody holds a lock for: leave with the parent.
if (process.send) process.on("disconnect", () => process.exit(1));

export type AnalyseOutcome = { outcome: "analysed" | "skipped" | "superseded" };

export default async function analyseCaptureJob(job: SandboxedJob<AnalysisJobData>): Promise<AnalyseOutcome> {
  const { captureId, labId } = job.data;
  const scope: Scope = { kind: "lab", labId };
  const claimed = await claimCaptureForAnalysis(scope, captureId);
  // Already analysed, rejected or failed (or deleted): nothing to do, and nothing to retry.
  if (!claimed) return { outcome: "skipped" };

  let lastReport = 0;
  let pending: Promise<void> = Promise.resolve();
  const onProgress = (percent: number) => {
    const now = Date.now();
    if (now - lastReport < PROGRESS_EVERY_MS) return;
    lastReport = now;
    pending = pending.then(async () => {
      await setCaptureProgress(scope, captureId, percent);
      await job.updateProgress(Math.round(percent));
    }).catch(() => undefined);
  };

  try {
    const judgement = await loadJudgement(claimed.rating, claimed.capture);
    const analysis = await runAnalysis(claimed.capture, judgement, onProgress);
    await pending;
    const stored = await recordAnalysis(scope, analysis);
    if (stored) await refreshUnitPlanState(scope, claimed.unit.id);
    return { outcome: stored ? "analysed" : "superseded" };
  } catch (err) {
    await pending;
    const message = err instanceof Error ? err.message : String(err);
    if (isCaptureRejection(err)) {
      // Bad input is final: the engine's message is what the operator sees.
      await setCaptureState(scope, captureId, "rejected", ["analysing"], { stateMessage: message, progress: 0 });
      throw new UnrecoverableError(message);
    }
    if (err instanceof ConfigurationProblem) {
      await setCaptureState(scope, captureId, "failed", ["analysing"], { stateMessage: message, progress: 0 });
      throw new UnrecoverableError(message);
    }
    const attempt = job.attemptsMade + 1;
    const allowed = job.opts.attempts ?? 1;
    const final = attempt >= allowed;
    await setCaptureState(scope, captureId, final ? "failed" : "queued", ["analysing"], {
      progress: 0,
      stateMessage: final
        ? `Analysis failed after ${attempt} attempts (${message}). It can be re-run once the cause is fixed.`
        : `Attempt ${attempt} of ${allowed} failed (${message}); retrying shortly.`,
    }).catch(() => undefined);
    throw err;
  }
}
