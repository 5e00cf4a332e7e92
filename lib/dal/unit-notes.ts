import "server-only";
import { z } from "zod";
import { insertUnitNote, listUnitNotes } from "@/db/queries/unit-notes";
import { HttpError } from "@/lib/auth/guards";
import { clientVisibleNotes, type ClientNote } from "@/lib/units/client-notes";
import { requirePageActor, type Actor } from "./actor";

export const noteFormSchema = z.object({
  unitId: z.uuid("Pick a unit"),
  visibility: z.enum(["internal", "client"], "Choose who the note is for: internal (lab only) or for the client"),
  body: z.string("Write the note").trim().min(1, "Write the note").max(4000, "Keep the note under 4000 characters"),
});

/** Lab staff (not station keys) write notes on their lab's units, choosing who each is for. */
export async function addUnitNote(actor: Actor, input: z.output<typeof noteFormSchema>) {
  if (actor.scope.kind !== "lab" || actor.role === "station" || !actor.userId) throw new HttpError(403, "Only lab staff write notes on a unit.");
  const row = await insertUnitNote(actor.scope, { unitId: input.unitId, authorId: actor.userId, visibility: input.visibility, body: input.body });
  if (!row) throw new HttpError(404, "No such unit.");
  return row;
}

export type NoteView = { id: string; visibility: "internal" | "client"; body: string; createdAt: Date; author: string | null };

/**
 * The unit page's notes: every note with its author for lab staff; for a client only the notes written
 * for it, without authors (filtered in the query and again by clientVisibleNotes).
 */
export async function getUnitNotesView(unitId: string): Promise<{ notes: NoteView[] | null; clientNotes: ClientNote[]; canWrite: boolean }> {
  return unitNotesFor(await requirePageActor(), unitId);
}

/** The same for any authorised caller (a client's API token included): a client gets clientNotes only. */
export async function unitNotesFor(actor: Actor, unitId: string): Promise<{ notes: NoteView[] | null; clientNotes: ClientNote[]; canWrite: boolean }> {
  if (!z.uuid().safeParse(unitId).success) return { notes: null, clientNotes: [], canWrite: false };
  const scope = actor.scope;
  const rows = await listUnitNotes(scope, unitId);
  if (scope.kind !== "lab" || actor.role === "station") return { notes: null, clientNotes: clientVisibleNotes(rows), canWrite: false };
  return { notes: rows, clientNotes: clientVisibleNotes(rows), canWrite: true };
}
