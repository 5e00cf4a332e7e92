import Link from "next/link";
import { notFound } from "next/navigation";
import { CaptureDetails } from "@/components/captures/capture-details";
import { CaptureLive } from "@/components/captures/capture-live";
import { fmtDate } from "@/components/captures/format";
import { PageHeader } from "@/components/shell/page-header";
import { SafetyCaution } from "@/components/shell/safety-caution";
import { StatusTag } from "@/components/ui/status-tag";
import { getCapturePageView } from "@/lib/dal/captures";

export const metadata = { title: "Capture" };

export default async function CapturePage({ params }: { params: Promise<{ id: string }> }) {
  const view = await getCapturePageView((await params).id);
  // Another organisation's capture is indistinguishable from a missing one.
  if (!view) notFound();
  const { capture: c, history } = view;
  const channels = c.analysis ? c.analysis.report.channels.map((ch) => ch.id) : Object.keys(c.channelRoles);
  return (
    <>
      <PageHeader
        title={c.originalName}
        lead={<>Unit <Link href={`/units/${c.unitId}`} className="font-mono">{c.serial}</Link> · {c.modelCode} · {c.ratingTitle}</>}
        actions={c.state !== "uploading" ? <a href={`/api/captures/${c.id}/raw`} className="rounded-md bg-white px-4 py-2 text-sm font-semibold ring-1 ring-ink-200">Download raw CSV</a> : null}
      />
      <div className="mb-6"><SafetyCaution compact /></div>
      <CaptureLive
        initial={c} canReanalyse={view.canReanalyse} correction={view.canCorrect ? { channels, planSteps: view.planSteps } : null}
        details={<CaptureDetails capture={c} />}
      />
      {view.corrections.length > 0 ? (
        <section className="mt-8" aria-labelledby="corrections">
          <h2 id="corrections" className="mb-2 text-lg font-semibold">Corrections</h2>
          <ul className="space-y-2 text-sm">
            {view.corrections.map((k) => (
              <li key={k.id} className="rounded-md bg-white p-3 ring-1 ring-ink-200">
                <span className="tabular-nums">{fmtDate(k.createdAt.toISOString())}</span> · {k.actor ?? "bench PC (station key)"} · <q>{k.reason}</q>
                <span className="block font-mono text-xs text-ink-600">{Object.keys(k.after).map((field) => `${field}: ${JSON.stringify(k.before[field])} → ${JSON.stringify(k.after[field])}`).join("; ")}</span>
              </li>
            ))}
          </ul>
        </section>
      ) : null}
      {history.length > 1 ? (
        <section className="mt-8">
          <h2 className="mb-2 text-lg font-semibold">Analysis history</h2>
          <ul className="space-y-1 text-sm">
            {history.map((h) => (
              <li key={h.id} className="flex gap-3">
                <span className="tabular-nums">{fmtDate(h.createdAt.toISOString())}</span>
                <span>{h.kind === "rejudge" ? "re-judged" : "analysed"} · engine {h.analysisVersion}{h.profileVersion !== null ? ` · profile v${h.profileVersion}` : ""}{h.stepName ? ` · ${h.stepName}` : ""}</span>
                <StatusTag status={h.overall} />
                {h.current ? <strong>current</strong> : null}
              </li>
            ))}
          </ul>
        </section>
      ) : null}
    </>
  );
}
