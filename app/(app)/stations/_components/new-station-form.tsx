"use client";

import { useActionState } from "react";
import { Button } from "@/components/ui/button";
import { Field, TextInput } from "@/components/ui/field";
import { Notice } from "@/components/ui/notice";
import { createStationAction, type StationState } from "../actions";

export function NewStationForm() {
  const [state, action, pending] = useActionState<StationState, FormData>(createStationAction, { ok: false, message: "" });
  return (
    <form action={action} className="grid gap-4 rounded-lg bg-white p-5 shadow-sm ring-1 ring-ink-200 md:grid-cols-3">
      <Field label="Bench name"><TextInput name="name" required minLength={2} maxLength={120} /></Field>
      <Field label="Location"><TextInput name="location" maxLength={120} /></Field>
      <div className="self-end"><Button type="submit" tone="quiet" disabled={pending}>Add bench</Button></div>
      {state.message ? <div className="md:col-span-3"><Notice kind={state.ok ? "done" : "problem"}>{state.message}</Notice></div> : null}
    </form>
  );
}
