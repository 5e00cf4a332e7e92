"use client";

import { useActionState } from "react";
import { Button } from "@/components/ui/button";
import { Field, Select, TextInput } from "@/components/ui/field";
import { Notice } from "@/components/ui/notice";
import { createUnitAction, type UnitFormState } from "../unit-actions";

export function NewUnitForm({ ratings }: { ratings: { id: string; label: string }[] }) {
  const [state, action, pending] = useActionState<UnitFormState, FormData>(createUnitAction, { ok: false, message: "" });
  return (
    <form action={action} className="max-w-xl space-y-4 rounded-lg bg-white p-5 shadow-sm ring-1 ring-ink-200">
      <Field label="Serial number"><TextInput name="serial" required maxLength={64} autoComplete="off" /></Field>
      <Field label="Rating" hint="The client follows the rating.">
        <Select name="ratingId" required defaultValue="">
          <option value="" disabled>Choose a rating…</option>
          {ratings.map((r) => <option key={r.id} value={r.id}>{r.label}</option>)}
        </Select>
      </Field>
      {state.similar && state.similar.length > 0 ? <Notice kind="info">Close to units on file: {state.similar.join(", ")}. Check the serial before registering a new unit.</Notice> : null}
      <label className="flex items-center gap-2 text-sm"><input type="checkbox" name="confirmNew" /> This is a new unit, not one already on file</label>
      {state.message ? <Notice kind={state.ok ? "done" : "problem"}>{state.message}</Notice> : null}
      <Button type="submit" disabled={pending}>Register the unit</Button>
    </form>
  );
}
