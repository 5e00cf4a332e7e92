import type { CaptureInstrumentsSummary } from "@/lib/dal/capture-instruments";
import { CaptureInstrumentsForm, OverdueConfirmForm } from "./capture-instruments-forms";

type Props = {
  captureId: string;
  summary: CaptureInstrumentsSummary;
  /** Lab staff may change the list; a quality engineer may confirm an overdue capture. */
  choices: { id: string; label: string }[] | null;
  canConfirm: boolean;
};

/** The instruments that took the capture, the overdue warning and its confirmation. */
export function CaptureInstruments({ captureId, summary, choices, canConfirm }: Props) {
  return (
    <section className="mb-6 rounded-lg bg-white p-5 text-sm shadow-sm ring-1 ring-ink-200" aria-labelledby="instruments-heading">
      <h2 id="instruments-heading" className="text-lg font-semibold">Instruments</h2>
      {summary.warnings.length > 0 ? (
        <div role="alert" className="mt-2 rounded-md border-2 border-edge-700 bg-edge-100 px-4 py-3" aria-label="Overdue instrument">
          <ul className="list-disc pl-5">{summary.warnings.map((w) => <li key={w}>{w}</li>)}</ul>
          {summary.confirmation
            ? <p className="mt-2 font-semibold">Confirmed {summary.confirmation.confirmedAt.slice(0, 10)}: <q>{summary.confirmation.reason}</q></p>
            : canConfirm ? <OverdueConfirmForm captureId={captureId} /> : <p className="mt-2 font-semibold">Not confirmed yet.</p>}
        </div>
      ) : null}
      {summary.instruments.length === 0 ? <p className="mt-2 text-ink-600">None recorded: the figures&apos; uncertainty is not evaluated.</p> : (
        <ul className="mt-2 space-y-1">
          {summary.instruments.map((i) => (
            <li key={`${i.id}-${i.channel}`}>
              <span className="font-mono">{i.assetTag}</span> · {i.description} · serial <span className="font-mono">{i.serial}</span>{i.channel ? ` · on ${i.channel}` : ""} · due {i.calibrationDue ?? "—"}
              {i.overdueAtUpload ? <strong className="ml-1">(overdue at upload)</strong> : null}{i.retired ? " · retired since" : ""}
            </li>
          ))}
        </ul>
      )}
      {choices && choices.length > 0 ? (
        <details className="mt-3"><summary className="cursor-pointer font-semibold text-copper-700">Change the instruments</summary>
          <div className="mt-2"><CaptureInstrumentsForm captureId={captureId} options={choices} chosen={summary.instruments.map((i) => i.id)} /></div>
        </details>
      ) : null}
    </section>
  );
}
