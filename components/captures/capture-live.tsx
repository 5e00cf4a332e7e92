"use client";

import { useQuery } from "@tanstack/react-query";
import type { ReactNode } from "react";
import { Notice } from "@/components/ui/notice";
import { StatusTag } from "@/components/ui/status-tag";
import { ANALYSIS_VERSION } from "@/lib/analysis/version";
import type { CaptureStatusView } from "@/lib/dal/captures";
import { CaptureStateBadge, ProgressBar } from "./capture-state-badge";
import { CapturePlots } from "./capture-plots";
import { CorrectionForm } from "./correction-form";
import { captureKeys, fetchCaptureStatus, isFinalState } from "./fetchers";
import { fmtDate } from "./format";
import { MetricsTable } from "./metrics-table";
import { ReanalyseButton } from "./reanalyse-button";
import { CaptureQueryProvider } from "./query-provider";
import { VerdictSummary } from "./verdict-summary";
import { VerdictsTable, WarningsList } from "./verdicts-table";
import { PhasorDiagram } from "@/components/phasors/phasor-diagram";

type Correction = { channels: string[]; planSteps: { id: string; name: string }[] } | null;
type Props = { initial: CaptureStatusView; canReanalyse: boolean; correction?: Correction; details?: ReactNode };

function CaptureLiveInner({ initial, canReanalyse, correction = null, details }: Props) {
  const { data } = useQuery({
    queryKey: captureKeys.status(initial.id),
    queryFn: () => fetchCaptureStatus(initial.id),
    initialData: initial,
    refetchInterval: (q) => (q.state.data && isFinalState(q.state.data.state) ? false : 1000),
  });
  const c = data ?? initial;
  const analysis = c.analysis;
  return (
    <div className="space-y-6">
      {analysis ? <VerdictSummary report={analysis.report} /> : null}
      <div className="flex flex-wrap items-center gap-3 rounded-lg bg-white p-4 shadow-sm ring-1 ring-ink-200" aria-live="polite">
        <span className="text-sm font-semibold">State</span>
        <CaptureStateBadge state={c.state} progress={c.progress} />
        {analysis ? <><span className="text-sm font-semibold">Overall</span><span data-testid="overall"><StatusTag status={analysis.report.overall} /></span></> : null}
        {analysis ? (
          <span className="text-xs text-ink-600">
            Current run <time data-testid="current-run" dateTime={analysis.createdAt}>{fmtDate(analysis.createdAt)}</time> · engine {analysis.analysisVersion}
            {analysis.profileVersion !== null ? ` · judged against profile v${analysis.profileVersion}` : ""}
            {analysis.stepName ? ` · plan step “${analysis.stepName}”` : " · no plan step matched"}
          </span>
        ) : null}
        {canReanalyse && isFinalState(c.state) ? <span className="ml-auto"><ReanalyseButton captureId={c.id} /></span> : null}
        {c.state === "analysing" ? <div className="w-full"><ProgressBar fraction={c.progress / 100} label="Analysis" /></div> : null}
        {c.state === "analysing" && c.stateMessage ? <p className="w-full text-xs text-ink-600" data-testid="state-message">{c.stateMessage}</p> : null}
        {c.state === "queued" ? <p className="w-full text-xs text-ink-600">{c.stateMessage ?? "Waiting for a worker; this page updates by itself."}</p> : null}
        {c.state === "uploading" ? <p className="w-full text-xs text-ink-600">The upload was not completed. Send the same file again from the upload page to finish it.</p> : null}
      </div>
      {details}
      {correction && isFinalState(c.state) ? <CorrectionForm capture={c} channels={correction.channels} planSteps={correction.planSteps} /> : null}
      {analysis && !isFinalState(c.state) ? <Notice kind="info">A new analysis run is on its way; the result below is the current one until it lands.</Notice> : null}
      {analysis && isFinalState(c.state) && analysis.analysisVersion !== ANALYSIS_VERSION ? (
        <Notice kind="info">
          This result was made by engine {analysis.analysisVersion}; the installed engine is {ANALYSIS_VERSION}. A re-run brings it up to date, and this result stays in the history.
        </Notice>
      ) : null}
      {c.state === "rejected" ? <Notice kind="problem" title="The capture was rejected">{c.stateMessage}</Notice> : null}
      {c.state === "failed" ? <Notice kind="problem" title="The analysis failed">{c.stateMessage}</Notice> : null}
      {analysis ? (
        <>
          <section>
            <h2 className="mb-2 text-lg font-semibold">Verdicts</h2>
            <VerdictsTable report={analysis.report} />
            <p className="mt-2 text-xs text-ink-600">Advisory measurements against the rating&apos;s tolerance profile; release of the unit is a qualified person&apos;s decision.</p>
          </section>
          <WarningsList report={analysis.report} />
          <PhasorDiagram report={analysis.report} />
          <section>
            <h2 className="mb-2 text-lg font-semibold">Metrics</h2>
            <MetricsTable report={analysis.report} />
          </section>
          <CapturePlots captureId={c.id} analysedAt={c.analysedAt} units={Object.fromEntries(analysis.report.channels.map((ch) => [ch.id, ch.unit]))} />
        </>
      ) : null}
    </div>
  );
}

/**
 * The live part of the capture page: the overall verdict first, the state, the capture's details
 * (server-rendered, passed in), then verdicts, phasors, metrics and plots once analysed.
 */
export function CaptureLive(props: Props) {
  return (
    <CaptureQueryProvider>
      <CaptureLiveInner {...props} />
    </CaptureQueryProvider>
  );
}
