type Event = { id: string; kind: string; from: string | null; to: string | null; comment: string; at: Date; actor: string };

const EVENT_WORDS: Record<string, string> = {
  "attachment-removed": "removed an attachment",
  "record-chosen": "chose a plan step's capture of record",
  "record-cleared": "made the latest capture a step's record again",
  edited: "edited the unit",
  retired: "retired the unit",
  restored: "restored the unit",
};

export function UnitHistory({ events }: { events: Event[] }) {
  if (events.length === 0) return <p className="text-sm text-ink-600">No decisions recorded yet.</p>;
  return (
    <ol className="space-y-3 text-sm">
      {events.map((e) => (
        <li key={e.id} className="border-l-2 border-copper-400 pl-3">
          {e.kind === "disposition" ? (
            <p><span className="font-semibold">{e.actor}</span> changed the disposition from <em>{e.from}</em> to <em>{e.to}</em></p>
          ) : (
            <p><span className="font-semibold">{e.actor}</span> {EVENT_WORDS[e.kind] ?? e.kind}</p>
          )}
          <p className="text-xs text-ink-600">{e.at.toISOString().replace("T", " ").slice(0, 16)} UTC</p>
          {e.comment ? <p className="mt-1 whitespace-pre-wrap">{e.comment}</p> : null}
        </li>
      ))}
    </ol>
  );
}
