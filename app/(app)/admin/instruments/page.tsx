import Link from "next/link";
import { PageHeader } from "@/components/shell/page-header";
import { EmptyState } from "@/components/ui/empty-state";
import { requireRoleActor } from "@/lib/dal/actor";
import { getRegisterPageView } from "@/lib/dal/instrument-pages";
import { INSTRUMENT_KIND_LABELS } from "@/lib/instruments/input-schemas";
import { BenchSetForm } from "./_components/bench-set-form";
import { CalibrationTag } from "./_components/calibration-tag";
import { InstrumentForm } from "./_components/instrument-form";

export const metadata = { title: "Instruments" };

export default async function InstrumentsPage() {
  const actor = await requireRoleActor("admin", "qa");
  const view = await getRegisterPageView(actor);
  return (
    <>
      <PageHeader
        title="Instruments"
        lead="Oscilloscopes, probes, DAQ units and tachometers with their accuracy and calibration. Captures record the instruments that took them; their specifications give each figure's uncertainty."
      />
      {view.instruments.length === 0 ? <EmptyState title="No instruments registered" /> : (
        <div className="overflow-x-auto rounded-lg bg-white shadow-sm ring-1 ring-ink-200">
          <table className="min-w-full text-sm" aria-label="Instrument register">
            <thead className="bg-ink-50 text-left"><tr>
              <th className="px-3 py-2">Asset tag</th><th className="px-3 py-2">Kind</th><th className="px-3 py-2">Make and model</th>
              <th className="px-3 py-2">Serial</th><th className="px-3 py-2">Calibrated</th><th className="px-3 py-2">Due</th><th className="px-3 py-2">Status</th>
            </tr></thead>
            <tbody>
              {view.instruments.map((i) => (
                <tr key={i.id} className="border-t border-ink-100">
                  <td className="px-3 py-2 font-mono"><Link className="text-copper-700 underline" href={`/admin/instruments/${i.id}`}>{i.assetTag}</Link></td>
                  <td className="px-3 py-2">{INSTRUMENT_KIND_LABELS[i.kind]}</td>
                  <td className="px-3 py-2">{i.make} {i.model}</td>
                  <td className="px-3 py-2 font-mono">{i.serial}</td>
                  <td className="px-3 py-2">{i.calibratedOn ?? "—"}</td>
                  <td className="px-3 py-2">{i.calibrationDue ?? "—"}</td>
                  <td className="px-3 py-2"><CalibrationTag status={i.status} /></td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
      {view.canEdit ? (
        <>
          <section className="mt-8">
            <h2 className="mb-3 text-lg font-semibold">Bench default sets</h2>
            {view.benches.length === 0 ? <p className="text-sm text-ink-600">No benches yet.</p> : (
              <div className="grid gap-6 md:grid-cols-2">
                {view.benches.map((b) => (
                  <div key={b.id} className="rounded-lg bg-white p-5 shadow-sm ring-1 ring-ink-200">
                    <BenchSetForm stationId={b.id} stationName={b.name} chosen={b.instrumentIds} options={view.instruments.filter((i) => !i.retiredAt).map((i) => ({ id: i.id, label: `${i.assetTag} · ${i.make} ${i.model}` }))} />
                  </div>
                ))}
              </div>
            )}
          </section>
          <section className="mt-8">
            <h2 className="mb-3 text-lg font-semibold">New instrument</h2>
            <div className="rounded-lg bg-white p-5 shadow-sm ring-1 ring-ink-200"><InstrumentForm /></div>
          </section>
        </>
      ) : null}
      {view.retired.length > 0 ? (
        <section className="mt-8">
          <h2 className="mb-3 text-lg font-semibold">Retired</h2>
          <ul className="space-y-1 text-sm">{view.retired.map((i) => <li key={i.id}><Link className="font-mono text-copper-700 underline" href={`/admin/instruments/${i.id}`}>{i.assetTag}</Link> · {i.make} {i.model} · retired {i.retiredAt?.toISOString().slice(0, 10)}</li>)}</ul>
        </section>
      ) : null}
    </>
  );
}
