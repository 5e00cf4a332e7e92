import type { NoteView } from "@/lib/dal/unit-notes";
import type { ClientNote } from "@/lib/units/client-notes";
import { NOTE_VISIBILITY_WORDS } from "@/lib/units/client-notes";
import { NoteForm } from "./note-form";

const stamp = (d: Date) => `${d.toISOString().replace("T", " ").slice(0, 16)} UTC`;

/** Lab staff see every note with its author and audience; a client sees only the notes written for it. */
export function UnitNotes({ unitId, notes, clientNotes, canWrite }: { unitId: string; notes: NoteView[] | null; clientNotes: ClientNote[]; canWrite: boolean }) {
  const list = notes ?? clientNotes.map((n, i) => ({ id: String(i), visibility: "client" as const, body: n.body, createdAt: n.createdAt, author: null }));
  return (
    <section aria-labelledby="notes" className="mt-6 grid gap-6 rounded-lg bg-white p-5 shadow-sm ring-1 ring-ink-200 md:grid-cols-2">
      <div>
        <h2 id="notes" className="mb-3 font-semibold">Notes</h2>
        {list.length === 0 ? <p className="text-sm text-ink-600">No notes yet.</p> : (
          <ol className="space-y-3 text-sm" data-testid="unit-notes">
            {list.map((n) => (
              <li key={n.id} className={`border-l-2 pl-3 ${n.visibility === "internal" ? "border-ink-400" : "border-copper-400"}`}>
                {notes ? <p className="text-xs font-semibold text-ink-600">{NOTE_VISIBILITY_WORDS[n.visibility]}{n.author ? ` · ${n.author}` : ""}</p> : null}
                <p className="whitespace-pre-wrap">{n.body}</p>
                <p className="text-xs text-ink-600">{stamp(n.createdAt)}</p>
              </li>
            ))}
          </ol>
        )}
      </div>
      {canWrite ? <NoteForm unitId={unitId} /> : null}
    </section>
  );
}
