"use client";

import { useActionState } from "react";
import { EMPTY_FORM, type FormState } from "@/components/ratings/form-state";
import { Button } from "@/components/ui/button";
import { Notice } from "@/components/ui/notice";
import { saveBenchSetAction } from "../actions";

type Option = { id: string; label: string };

/** A bench's default instrument set: ticked instruments are copied onto each capture it uploads. */
export function BenchSetForm({ stationId, stationName, options, chosen }: { stationId: string; stationName: string; options: Option[]; chosen: string[] }) {
  const [state, action, pending] = useActionState<FormState, FormData>(saveBenchSetAction, EMPTY_FORM);
  return (
    <form action={action} aria-label={`Default instruments of ${stationName}`} className="space-y-3">
      {state.message ? <Notice kind={state.ok ? "done" : "problem"}>{state.message}</Notice> : null}
      <input type="hidden" name="stationId" value={stationId} />
      <fieldset>
        <legend className="font-semibold">{stationName}</legend>
        <div className="mt-2 grid gap-1 sm:grid-cols-2">
          {options.map((o) => (
            <label key={o.id} className="flex items-center gap-2 text-sm">
              <input type="checkbox" name="instrumentIds" value={o.id} defaultChecked={chosen.includes(o.id)} />
              {o.label}
            </label>
          ))}
        </div>
      </fieldset>
      <Button type="submit" disabled={pending}>{pending ? "Saving…" : "Save default set"}</Button>
    </form>
  );
}
