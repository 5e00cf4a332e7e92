import type { HistoryEvent } from "@/lib/dal/review";
import { DISPOSITION_WORDS, type DispositionValue } from "@/lib/units/disposition-rules";

const EVENT_WORDS: Record<string, string> = {
  "attachment-removed": "removed an attachment",
  "record-chosen": "chose a plan step's capture of record",
  "record-cleared": "made the latest capture a step's record again",
  edited: "edited the unit",
  retired: "retired the unit",
  restored: "restored the unit",
  assigned: "assigned the unit for review",
};

const words = (d: string | null) => (d && d in DISPOSITION_WORDS ? DISPOSITION_WORDS[d as DispositionValue] : d ?? "—");
const stamp = (d: Date) => `${d.toISOString().replace("T", " ").slice(0, 16)} UTC`;

/** The unit's decisions; for a client the DAL has already removed names, comments and staff-only events. */
export function UnitHistory({ events }: { events: HistoryEvent[] }) {
  if (events.length === 0) return <p className="text-sm text-ink-600">No decisions recorded yet.</p>;
  return (
    <ol className="space-y-3 text-sm" data-testid="unit-history">
      {events.map((e) => (
        <li key={e.id} className="border-l-2 border-copper-400 pl-3">
          {e.kind === "disposition" ? (
            <p>{e.actor ? <span className="font-semibold">{e.actor} </span> : "The lab "}changed the disposition from <em>{words(e.from)}</em> to <em>{words(e.to)}</em></p>
          ) : (
            <p><span className="font-semibold">{e.actor}</span> {EVENT_WORDS[e.kind] ?? e.kind}{e.detail ? ` to ${e.detail}` : ""}</p>
          )}
          <p className="text-xs text-ink-600">{stamp(e.at)}</p>
          {e.concessionRef ? <p className="mt-1">Concession reference: <span className="font-mono">{e.concessionRef}</span></p> : null}
          {e.comment ? <p className="mt-1 whitespace-pre-wrap">{e.comment}</p> : null}
          {e.signature ? (
            <p className="mt-1 text-xs" data-testid="signature">
              Signed{e.signature.name ? ` by ${e.signature.name}` : ""}, {e.signature.role}, {stamp(e.signature.at)}: {e.signature.meaning}
            </p>
          ) : null}
        </li>
      ))}
    </ol>
  );
}
