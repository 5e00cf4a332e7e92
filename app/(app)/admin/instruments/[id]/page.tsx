import Link from "next/link";
import { notFound } from "next/navigation";
import { PageHeader } from "@/components/shell/page-header";
import { HttpError } from "@/lib/auth/guards";
import { requireRoleActor } from "@/lib/dal/actor";
import { getInstrumentPageView } from "@/lib/dal/instrument-pages";
import { INSTRUMENT_KIND_LABELS } from "@/lib/instruments/input-schemas";
import { CalibrationTag } from "../_components/calibration-tag";
import { CertificateUploader } from "../_components/certificate-uploader";
import { InstrumentForm } from "../_components/instrument-form";
import { RetireForm } from "../_components/retire-form";

export const metadata = { title: "Instrument" };

const SPEC_LABELS: Record<string, string> = {
  gainPercentOfReading: "Gain ± % of reading", offset: "Offset ±", offsetUnit: "Offset unit", bandwidthHz: "Bandwidth, Hz",
  timebasePpm: "Timebase ± ppm", speedPercentOfReading: "Speed ± % of reading", speedOffsetRpm: "Speed offset ± rpm", resolutionBits: "Resolution, bits",
};

export default async function InstrumentPage({ params }: { params: Promise<{ id: string }> }) {
  const actor = await requireRoleActor("admin", "qa");
  const view = await getInstrumentPageView(actor, (await params).id).catch((err: unknown) => {
    if (err instanceof HttpError && err.status === 404) notFound();
    throw err;
  });
  const i = view.instrument;
  return (
    <>
      <PageHeader title={`${i.assetTag} · ${i.make} ${i.model}`} lead={<><Link className="text-copper-700 underline" href="/admin/instruments">Instruments</Link> · {INSTRUMENT_KIND_LABELS[i.kind]} · serial <span className="font-mono">{i.serial}</span></>} />
      <section className="rounded-lg bg-white p-5 shadow-sm ring-1 ring-ink-200" aria-label="Calibration">
        <p className="flex flex-wrap items-center gap-3 text-sm"><CalibrationTag status={i.status} /> calibrated {i.calibratedOn ?? "—"} · due {i.calibrationDue ?? "—"}</p>
        {i.calibrationNote ? <p className="mt-2 text-sm text-ink-700">{i.calibrationNote}</p> : null}
        <dl className="mt-4 grid gap-2 text-sm sm:grid-cols-3">
          {Object.entries(i.spec).map(([k, val]) => <div key={k}><dt className="text-ink-600">{SPEC_LABELS[k] ?? k}</dt><dd className="font-mono">{String(val)}</dd></div>)}
          {Object.keys(i.spec).length === 0 ? <p className="text-ink-600">No accuracy stated: captures taken with it get no uncertainty from it.</p> : null}
        </dl>
      </section>
      <section className="mt-6" aria-label="Certificates">
        <h2 className="mb-2 text-lg font-semibold">Calibration certificates</h2>
        {view.certificates.length === 0 ? <p className="text-sm text-ink-600">No certificate on file.</p> : (
          <ul className="space-y-1 text-sm">{view.certificates.map((c) => <li key={c.id}><a className="text-copper-700 underline" href={`/api/instruments/${i.id}/certificates/${c.id}`}>{c.originalName}</a> · {c.createdAt.toISOString().slice(0, 10)}</li>)}</ul>
        )}
        {view.canEdit && !i.retiredAt ? <div className="mt-3"><CertificateUploader instrumentId={i.id} /></div> : null}
      </section>
      <section className="mt-6" aria-label="Captures">
        <h2 className="mb-2 text-lg font-semibold">Benches</h2>
        <p className="text-sm">{view.benches.length > 0 ? view.benches.join(", ") : "In no bench's default set."}</p>
      </section>
      {view.canEdit && !i.retiredAt ? (
        <>
          <section className="mt-6">
            <h2 className="mb-3 text-lg font-semibold">Edit</h2>
            <div className="rounded-lg bg-white p-5 shadow-sm ring-1 ring-ink-200"><InstrumentForm instrument={{ ...i, spec: i.spec as Record<string, number | string | undefined> }} /></div>
          </section>
          <section className="mt-6"><RetireForm instrumentId={i.id} /></section>
        </>
      ) : null}
    </>
  );
}
