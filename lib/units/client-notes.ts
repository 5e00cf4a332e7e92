// What of a unit's notes may reach its client (pages, API, released report files). Pure.

export type AnyNote = { visibility: "internal" | "client"; body: string; createdAt: Date; author?: string | null };
export type ClientNote = { body: string; createdAt: Date };

/** Only notes written for the client, without who wrote them (staff names stay inside the lab). */
export function clientVisibleNotes(notes: readonly AnyNote[]): ClientNote[] {
  return notes.filter((n) => n.visibility === "client").map((n) => ({ body: n.body, createdAt: n.createdAt }));
}

export const NOTE_VISIBILITY_WORDS = { internal: "Internal (lab only)", client: "For the client" } as const;
