import type { AnalysisReport } from "@/lib/analysis";
import { fmt, fmtFixed } from "./format";

/** Per-channel metrics, then three-phase and back-EMF figures when the capture has them. */
export function MetricsTable({ report }: { report: AnalysisReport }) {
  const rows: [string, (c: AnalysisReport["channels"][number]) => string][] = [
    ["Role", (c) => c.role],
    ["True RMS", (c) => `${fmt(c.rms)} ${c.unit}`],
    ["Fundamental RMS", (c) => `${fmt(c.fundamental.rms)} ${c.unit}`],
    ["Fundamental phase", (c) => `${fmtFixed(c.fundamental.phaseDeg, 2)}°`],
    ["Peak", (c) => `${fmt(c.peak)} ${c.unit}`],
    ["DC", (c) => `${fmtFixed(c.dc, 3)} ${c.unit}`],
    ["Crest factor", (c) => fmt(c.crestFactor)],
    ["THD-F", (c) => `${fmt(c.thdFPercent, 3)} %`],
    ["THD-R", (c) => `${fmt(c.thdRPercent, 3)} %`],
    ["THF", (c) => (c.thfPercent === null ? "—" : `${fmt(c.thfPercent, 3)} %`)],
    ["TIF", (c) => fmt(c.tif, 3)],
    ["Deviation factor", (c) => (c.deviationFactorPercent === null ? "—" : `${fmt(c.deviationFactorPercent, 3)} %`)],
  ];
  const tp = report.threePhase;
  const be = report.backEmf;
  return (
    <div className="space-y-4">
      <p className="text-sm">
        Frequency <strong className="tabular-nums">{fmt(report.frequencyHz, 6)} Hz</strong> · {report.cyclesAnalysed} whole cycles ·{" "}
        {fmt(report.sampleRateHz / 1000, 4)} kS/s · {report.sampleCount.toLocaleString("en")} samples
      </p>
      <div className="overflow-x-auto rounded-lg bg-white shadow-sm ring-1 ring-ink-200">
        <table className="min-w-full text-sm" aria-label="Channel metrics">
          <thead className="bg-ink-100 text-left text-xs text-ink-600">
            <tr><th className="px-3 py-2">Metric</th>{report.channels.map((c) => <th key={c.id} className="px-3 py-2 font-mono">{c.id}</th>)}</tr>
          </thead>
          <tbody>
            {rows.map(([label, value]) => (
              <tr key={label} className="border-t border-ink-100">
                <th scope="row" className="px-3 py-1.5 text-left font-semibold">{label}</th>
                {report.channels.map((c) => <td key={c.id} className="px-3 py-1.5 tabular-nums">{value(c)}</td>)}
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      {tp ? (
        <dl className="grid grid-cols-2 gap-3 rounded-lg bg-white p-4 text-sm shadow-sm ring-1 ring-ink-200 md:grid-cols-4">
          <div><dt className="text-ink-600">Sequence</dt><dd className="font-semibold">{tp.sequence}</dd></div>
          <div><dt className="text-ink-600">Displacement AB / BC / CA</dt><dd className="tabular-nums">{fmtFixed(tp.displacementDeg.ab, 2)}° / {fmtFixed(tp.displacementDeg.bc, 2)}° / {fmtFixed(tp.displacementDeg.ca, 2)}°</dd></div>
          <div><dt className="text-ink-600">Unbalance VUF / NEMA / IEEE</dt><dd className="tabular-nums">{fmtFixed(tp.unbalance.vufPercent)} / {fmtFixed(tp.unbalance.nemaPercent)} / {fmtFixed(tp.unbalance.ieeePercent)} %</dd></div>
          <div><dt className="text-ink-600">Line-to-line RMS</dt><dd className="tabular-nums">{tp.lineToLine.map((l) => `${l.id} ${fmt(l.rms)} V`).join(" · ")}</dd></div>
        </dl>
      ) : null}
      {be ? (
        <dl className="grid grid-cols-2 gap-3 rounded-lg bg-white p-4 text-sm shadow-sm ring-1 ring-ink-200 md:grid-cols-4">
          <div><dt className="text-ink-600">Ke (V<sub>LL,rms</sub>/krpm)</dt><dd className="tabular-nums font-semibold">{fmt(be.keLineRmsPerKrpm)}</dd></div>
          <div><dt className="text-ink-600">Ke (V<sub>LL,pk</sub>/krpm)</dt><dd className="tabular-nums">{fmt(be.keLinePeakPerKrpm)}</dd></div>
          <div><dt className="text-ink-600">Ke (V<sub>ph,pk</sub>/(rad/s))</dt><dd className="tabular-nums">{fmt(be.kePhasePeakPerRadS)}</dd></div>
          <div><dt className="text-ink-600">Speed · poles · expected f</dt><dd className="tabular-nums">{fmt(be.speedRpm)} rpm · {be.poles} · {fmt(be.expectedFrequencyHz)} Hz</dd></div>
        </dl>
      ) : null}
    </div>
  );
}
