import type { AnalysisReport } from "@/lib/analysis";
import { formatFigure, type Quantity } from "@/lib/verdicts/format-figure";
import { fmt } from "./format";

const f = (value: number | null | undefined, quantity: Quantity) => formatFigure(value, { quantity });
const level = (unit: "V" | "A"): Quantity => (unit === "A" ? "current" : "voltage");

/** Per-channel metrics, then three-phase and back-EMF figures when the capture has them. */
export function MetricsTable({ report }: { report: AnalysisReport }) {
  const rows: [string, (c: AnalysisReport["channels"][number]) => string][] = [
    ["Role", (c) => c.role],
    ["True RMS", (c) => `${f(c.rms, level(c.unit))} ${c.unit}`],
    ["Fundamental RMS", (c) => `${f(c.fundamental.rms, level(c.unit))} ${c.unit}`],
    ["Fundamental phase", (c) => `${f(c.fundamental.phaseDeg, "angle")}°`],
    ["Peak", (c) => `${f(c.peak, level(c.unit))} ${c.unit}`],
    ["DC", (c) => `${f(c.dc, level(c.unit))} ${c.unit}`],
    ["Crest factor", (c) => f(c.crestFactor, "ratio")],
    ["THD-F", (c) => `${f(c.thdFPercent, "percent")} %`],
    ["THD-R", (c) => `${f(c.thdRPercent, "percent")} %`],
    ["THF", (c) => (c.thfPercent === null ? "—" : `${f(c.thfPercent, "percent")} %`)],
    ["TIF", (c) => f(c.tif, "tif")],
    ["Deviation factor", (c) => (c.deviationFactorPercent === null ? "—" : `${f(c.deviationFactorPercent, "percent")} %`)],
  ];
  const tp = report.threePhase;
  const be = report.backEmf;
  return (
    <div className="space-y-4">
      <p className="text-sm">
        Frequency <strong className="tabular-nums">{f(report.frequencyHz, "frequency")} Hz</strong> · {report.cyclesAnalysed} whole cycles ·{" "}
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
          <div><dt className="text-ink-600">Displacement AB / BC / CA</dt><dd className="tabular-nums">{f(tp.displacementDeg.ab, "angle")}° / {f(tp.displacementDeg.bc, "angle")}° / {f(tp.displacementDeg.ca, "angle")}°</dd></div>
          <div><dt className="text-ink-600">Unbalance VUF / NEMA / IEEE</dt><dd className="tabular-nums">{f(tp.unbalance.vufPercent, "percent")} / {f(tp.unbalance.nemaPercent, "percent")} / {f(tp.unbalance.ieeePercent, "percent")} %</dd></div>
          <div><dt className="text-ink-600">Line-to-line RMS</dt><dd className="tabular-nums">{tp.lineToLine.map((l) => `${l.id} ${f(l.rms, "voltage")} V`).join(" · ")}</dd></div>
        </dl>
      ) : null}
      {be ? (
        <dl className="grid grid-cols-2 gap-3 rounded-lg bg-white p-4 text-sm shadow-sm ring-1 ring-ink-200 md:grid-cols-4">
          <div><dt className="text-ink-600">Ke (V<sub>LL,rms</sub>/krpm)</dt><dd className="tabular-nums font-semibold">{f(be.keLineRmsPerKrpm, "ke")}</dd></div>
          <div><dt className="text-ink-600">Ke (V<sub>LL,pk</sub>/krpm)</dt><dd className="tabular-nums">{f(be.keLinePeakPerKrpm, "ke")}</dd></div>
          <div><dt className="text-ink-600">Ke (V<sub>ph,pk</sub>/(rad/s))</dt><dd className="tabular-nums">{f(be.kePhasePeakPerRadS, "ke")}</dd></div>
          <div><dt className="text-ink-600">Speed · poles · expected f</dt><dd className="tabular-nums">{f(be.speedRpm, "speed")} rpm · {be.poles} · {f(be.expectedFrequencyHz, "frequency")} Hz</dd></div>
        </dl>
      ) : null}
    </div>
  );
}
