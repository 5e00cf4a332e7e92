"use client";

import { useActionState } from "react";
import { Button } from "@/components/ui/button";
import { Field, TextArea } from "@/components/ui/field";
import { Notice } from "@/components/ui/notice";
import { addNote, type NoteState } from "../actions";

/** A note on the unit; who it is for is chosen when it is written and cannot be changed later. */
export function NoteForm({ unitId }: { unitId: string }) {
  const [state, action, pending] = useActionState<NoteState, FormData>(addNote, { ok: false, message: "" });
  const visibility = state.ok ? "internal" : state.values?.visibility ?? "internal";
  return (
    <form key={state.message} action={action} className="space-y-3" aria-label="Add a note">
      {state.message ? <Notice kind={state.ok ? "done" : "problem"}>{state.message}</Notice> : null}
      <input type="hidden" name="unitId" value={unitId} />
      <fieldset className="text-sm">
        <legend className="font-semibold text-ink-800">Who is the note for?</legend>
        <label className="mr-4 inline-flex items-center gap-1"><input type="radio" name="visibility" value="internal" defaultChecked={visibility === "internal"} /> Internal (lab only)</label>
        <label className="inline-flex items-center gap-1"><input type="radio" name="visibility" value="client" defaultChecked={visibility === "client"} /> For the client</label>
      </fieldset>
      <Field label="Note">
        <TextArea name="body" maxLength={4000} defaultValue={state.ok ? "" : state.values?.body ?? ""} />
      </Field>
      <Button type="submit" tone="quiet" disabled={pending}>{pending ? "Adding…" : "Add note"}</Button>
    </form>
  );
}
