"use client";

import { useActionState } from "react";
import { Button } from "@/components/ui/button";
import { Field, Select, TextArea } from "@/components/ui/field";
import { Notice } from "@/components/ui/notice";
import { setDisposition, type DispositionState } from "../actions";

export const DISPOSITION_LABELS = {
  open: "Open (no decision)",
  accepted: "Accepted",
  "accepted-with-concession": "Accepted with concession",
  rework: "Return for rework",
  scrapped: "Scrapped",
} as const;

export function DispositionPanel({ unitId, current }: { unitId: string; current: keyof typeof DISPOSITION_LABELS }) {
  const [state, action, pending] = useActionState<DispositionState, FormData>(setDisposition, { ok: false, message: "" });
  return (
    // Keyed on the answer so the fields take the echoed values as their defaults after each submission.
    <form key={`${state.message}-${state.values?.to ?? current}`} action={action} className="space-y-3">
      {state.message ? <Notice kind={state.ok ? "done" : "problem"}>{state.message}</Notice> : null}
      <input type="hidden" name="unitId" value={unitId} />
      <Field label="Disposition">
        <Select name="to" defaultValue={state.values?.to ?? current}>
          {Object.entries(DISPOSITION_LABELS).map(([value, label]) => <option key={value} value={value}>{label}</option>)}
        </Select>
      </Field>
      <Field label="Comment for the record" hint="Required for a concession, rework or scrap.">
        <TextArea name="comment" maxLength={2000} defaultValue={state.ok ? "" : state.values?.comment ?? ""} />
      </Field>
      <Button type="submit" disabled={pending}>{pending ? "Recording…" : "Record disposition"}</Button>
    </form>
  );
}
