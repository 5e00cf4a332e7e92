import { UnrecoverableError, type SandboxedJob } from "bullmq";
import { isCaptureRejection } from "@/lib/analysis";
import { recordAnalysis } from "@/db/queries/analyses";
import { listCaptureInstruments } from "@/db/queries/instruments";
import { claimCaptureForAnalysis, noteCaptureWaiting, setCaptureProgress, setCaptureState } from "@/db/queries/captures";
import type { Scope } from "@/db/queries/scope";
import { getEnv } from "@/lib/server/env";
import { logDetail, outageSentence, ServiceOutage, talkingTo } from "@/lib/server/outage";
import type { AnalysisJobData } from "@/lib/server/queue";
import { refreshUnitPlanState } from "@/db/queries/unit-plan";
import { ConfigurationProblem, loadJudgement } from "@/lib/server/judgement";
import { alertOnCaptureResult } from "@/lib/server/mail-capture-alerts";
import { rideOutages } from "../outage-ride";
import { failureMessage } from "./messages";
import { runAnalysis } from "./run-analysis";

// Runs in a sandboxed child process (see worker/index.ts), so parsing and analysis never block
// the parent's lock renewal. The job carries ids only; everything else is read from the database,
// which is also where progress goes (the child never talks to Redis, so a Redis restart cannot
// fail a running analysis).

const PROGRESS_EVERY_MS = 500;

// A forked child outliving its worker would finish jobs nobody holds a lock for: leave with the parent.
if (process.send) process.on("disconnect", () => process.exit(1));

/** `mailIds`: capture alerts written to the outbox; the parent enqueues them (this child never talks to Redis). */
export type AnalyseOutcome = { outcome: "analysed" | "skipped" | "superseded"; mailIds?: string[] };

export default async function analyseCaptureJob(job: SandboxedJob<AnalysisJobData>): Promise<AnalyseOutcome> {
  const { captureId, labId } = job.data;
  const scope: Scope = { kind: "lab", labId };
  const log = (line: string) => console.error(`${new Date().toISOString()} job ${job.id}: ${line}`);
  const ride = { maxWaitMs: getEnv().WORKER_OUTAGE_WAIT_S * 1000, log,
    // The page says why nothing moves (and the row's update time shows a live worker).
    onWait: (outage: ServiceOutage) => noteCaptureWaiting(scope, captureId, outageSentence(outage.service, "analysis")) };
  const db = <T>(work: () => Promise<T>) => talkingTo("database", work);

  const claimed = await rideOutages("claim", () => db(() => claimCaptureForAnalysis(scope, captureId)), ride);
  // Already analysed, rejected or failed (or deleted): nothing to do, and nothing to retry.
  if (!claimed) return { outcome: "skipped" };

  let lastReport = 0;
  let pending: Promise<void> = Promise.resolve();
  const onProgress = (percent: number) => {
    const now = Date.now();
    if (now - lastReport < PROGRESS_EVERY_MS) return;
    lastReport = now;
    pending = pending.then(() => setCaptureProgress(scope, captureId, percent)).catch(() => undefined);
  };

  try {
    const judgement = await rideOutages("load the judgement", () => db(() => loadJudgement(claimed.rating, claimed.capture)), ride);
    // The instruments' specifications feed the uncertainty budgets (none recorded: "not evaluated").
    const instruments = (await rideOutages("load the instruments", () => db(() => listCaptureInstruments(captureId)), ride))
      .map(({ instrument, channel }) => ({ assetTag: instrument.assetTag, kind: instrument.kind, channel, spec: instrument.spec }));
    const analysis = await rideOutages("read and analyse", () => runAnalysis(claimed.capture, judgement, onProgress, instruments), ride);
    await pending;
    const stored = await rideOutages("store the report", () => db(() => recordAnalysis(scope, analysis)), ride);
    if (stored) await rideOutages("refresh the unit's plan", () => db(() => refreshUnitPlanState(scope, claimed.unit.id)), ride);
    // Outside tolerance or inconclusive: alert the quality engineers (never fails the job).
    const alerts = stored ? await alertOnCaptureResult(labId, captureId, { enqueue: false }) : { ids: [] };
    return { outcome: stored ? "analysed" : "superseded", mailIds: alerts.ids };
  } catch (err) {
    await pending;
    if (isCaptureRejection(err)) {
      // Bad input is final: the engine's message is what the operator sees.
      await db(() => setCaptureState(scope, captureId, "rejected", ["analysing"], { stateMessage: err.message, progress: 0 }));
      throw new UnrecoverableError(err.message);
    }
    if (err instanceof ConfigurationProblem) {
      await db(() => setCaptureState(scope, captureId, "failed", ["analysing"], { stateMessage: err.message, progress: 0 }));
      throw new UnrecoverableError(err.message);
    }
    // First lines and the call sites only: a failed query's full text carries the whole report as parameters.
    const where = err instanceof Error ? (err.stack ?? "").split("\n").filter((l) => l.startsWith("    at ")).slice(0, 8).join("\n") : "";
    log(`attempt ${job.attemptsMade + 1} failed: ${logDetail(err)}${where ? `\n${where}` : ""}`);
    const attempt = job.attemptsMade + 1;
    const allowed = job.opts.attempts ?? 1;
    // An outage longer than the ride never ends a capture: it goes back to queued, and the sweep
    // enqueues it again once the service answers.
    const final = attempt >= allowed && !(err instanceof ServiceOutage);
    await setCaptureState(scope, captureId, final ? "failed" : "queued", ["analysing"], {
      progress: 0, stateMessage: failureMessage(err, attempt, allowed),
    }).catch(() => undefined);
    // The job's failed reason is the plain sentence too (it is what the sweep and the parent read).
    const plain = new Error(failureMessage(err, attempt, allowed));
    plain.name = err instanceof ServiceOutage ? "ServiceOutage" : "AnalysisError";
    throw plain;
  }
}
