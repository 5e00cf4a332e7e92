import Link from "next/link";
import { notFound } from "next/navigation";
import { CaptureInstruments } from "@/components/captures/capture-instruments";
import { CaptureLive } from "@/components/captures/capture-live";
import { UncertaintyBudget } from "@/components/captures/uncertainty-budget";
import { fmtDate } from "@/components/captures/format";
import { PageHeader } from "@/components/shell/page-header";
import { SafetyCaution } from "@/components/shell/safety-caution";
import { StatusTag } from "@/components/ui/status-tag";
import { TEST_KIND_LABELS } from "@/lib/captures/input-schemas";
import { getCaptureInstrumentsPageView } from "@/lib/dal/capture-instruments";
import { getCapturePageView } from "@/lib/dal/captures";

export const metadata = { title: "Capture" };

export default async function CapturePage({ params }: { params: Promise<{ id: string }> }) {
  const view = await getCapturePageView((await params).id);
  // Another organisation's capture is indistinguishable from a missing one.
  if (!view) notFound();
  const { capture: c, history } = view;
  const instruments = await getCaptureInstrumentsPageView(c.id);
  const roles = Object.entries(c.channelRoles);
  const channels = c.analysis ? c.analysis.report.channels.map((ch) => ch.id) : Object.keys(c.channelRoles);
  const scales = Object.entries(c.probeScales).map(([k, v]) => `${k} ×${v}`).concat(Object.entries(c.channelOffsets).map(([k, v]) => `${k} ${v >= 0 ? "+" : ""}${v}`));
  return (
    <>
      <PageHeader
        title={c.originalName}
        lead={<>Unit <Link href={`/units/${c.unitId}`} className="font-mono">{c.serial}</Link> · {c.modelCode} · {c.ratingTitle}</>}
        actions={c.state !== "uploading" ? <a href={`/api/captures/${c.id}/raw`} className="rounded-md bg-white px-4 py-2 text-sm font-semibold ring-1 ring-ink-200">Download raw CSV</a> : null}
      />
      <div className="mb-6"><SafetyCaution compact /></div>
      <dl className="mb-6 grid grid-cols-2 gap-4 rounded-lg bg-white p-5 text-sm shadow-sm ring-1 ring-ink-200 md:grid-cols-4">
        <div><dt className="text-ink-600">Test</dt><dd className="mt-1 font-semibold">{TEST_KIND_LABELS[c.testKind as keyof typeof TEST_KIND_LABELS] ?? c.testKind}</dd></div>
        <div><dt className="text-ink-600">Shaft speed</dt><dd className="mt-1">{c.speedRpm ? `${c.speedRpm} rpm` : "—"}</dd></div>
        <div><dt className="text-ink-600">Bench</dt><dd className="mt-1">{c.stationName ?? "—"}</dd></div>
        <div><dt className="text-ink-600">Uploaded</dt><dd className="mt-1">{fmtDate(c.uploadedAt ?? c.createdAt)}{c.uploadedBy ? ` by ${c.uploadedBy}` : ""}</dd></div>
        <div className="col-span-2"><dt className="text-ink-600">Channel roles</dt><dd className="mt-1 font-mono text-xs">{roles.length ? roles.map(([k, v]) => `${k} → ${v}`).join(" · ") : "from the headers"}</dd></div>
        <div className="col-span-2"><dt className="text-ink-600">Probe ratios and offsets</dt><dd className="mt-1 font-mono text-xs">{scales.length ? scales.join(" · ") : "none entered (×1)"}</dd></div>
        <div><dt className="text-ink-600">Size</dt><dd className="mt-1 tabular-nums">{(c.sizeBytes / 1024 ** 2).toFixed(2)} MiB</dd></div>
        <div><dt className="text-ink-600">sha256</dt><dd className="mt-1 truncate font-mono text-xs" title={c.sha256}>{c.sha256}</dd></div>
        {c.notes ? <div className="col-span-full"><dt className="text-ink-600">Notes</dt><dd className="mt-1 whitespace-pre-wrap">{c.notes}</dd></div> : null}
      </dl>
      {instruments ? <CaptureInstruments captureId={c.id} {...instruments} /> : null}
      <CaptureLive initial={c} canReanalyse={view.canReanalyse} correction={view.canCorrect ? { channels, planSteps: view.planSteps } : null} />
      {c.analysis ? <UncertaintyBudget report={c.analysis.report} /> : null}
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
