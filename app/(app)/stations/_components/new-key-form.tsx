"use client";

import { useActionState } from "react";
import { Button } from "@/components/ui/button";
import { Field, Select, TextInput } from "@/components/ui/field";
import { Notice } from "@/components/ui/notice";
import { createKeyAction, type KeyState } from "../actions";

/** Creates a station key and shows its token once. */
export function NewKeyForm({ stations }: { stations: { id: string; name: string }[] }) {
  const [state, action, pending] = useActionState<KeyState, FormData>(createKeyAction, { ok: false, message: "" });
  return (
    <form action={action} className="grid gap-4 rounded-lg bg-white p-5 shadow-sm ring-1 ring-ink-200 md:grid-cols-3">
      <Field label="Bench">
        <Select name="stationId" defaultValue={stations[0]?.id}>
          {stations.map((s) => <option key={s.id} value={s.id}>{s.name}</option>)}
        </Select>
      </Field>
      <Field label="Key label" hint="Which PC or script uses it.">
        <TextInput name="label" required minLength={2} maxLength={80} />
      </Field>
      <div className="self-end"><Button type="submit" disabled={pending}>Create station key</Button></div>
      {state.message ? (
        <div className="md:col-span-3">
          <Notice kind={state.ok ? "done" : "problem"} title={state.message}>
            {state.token ? <code data-testid="new-station-key" className="block select-all break-all rounded bg-ink-900 px-3 py-2 font-mono text-white">{state.token}</code> : null}
          </Notice>
        </div>
      ) : null}
    </form>
  );
}
