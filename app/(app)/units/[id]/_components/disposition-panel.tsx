"use client";

import { useActionState, useState } from "react";
import { Button } from "@/components/ui/button";
import { Field, Select, TextArea, TextInput } from "@/components/ui/field";
import { Notice } from "@/components/ui/notice";
import { CLOSED_DISPOSITIONS } from "@/lib/units/disposition-rules";
import { setDisposition, type DispositionState } from "../actions";

export const DISPOSITION_LABELS = {
  open: "Open (no decision)",
  accepted: "Accepted",
  "accepted-with-concession": "Accepted with concession",
  rework: "Return for rework",
  scrapped: "Scrapped",
} as const;

type DispositionKey = keyof typeof DISPOSITION_LABELS;

/** Which choices are signed: a concession, a scrap and reopening a closed unit (the server decides again). */
function needsSignature(current: DispositionKey, to: DispositionKey): boolean {
  return to === "accepted-with-concession" || to === "scrapped" || (to === "open" && CLOSED_DISPOSITIONS.includes(current));
}

export function DispositionPanel({ unitId, current, withinNote }: { unitId: string; current: DispositionKey; withinNote: string | null }) {
  const [state, action, pending] = useActionState<DispositionState, FormData>(setDisposition, { ok: false, message: "" });
  const initial = (state.values?.to as DispositionKey | undefined) ?? current;
  const [to, setTo] = useState<DispositionKey>(initial);
  const errors = state.fieldErrors ?? {};
  const signed = needsSignature(current, to);
  return (
    // Keyed on the answer so the fields take the echoed values as their defaults after each submission.
    <form key={`${state.message}-${initial}`} action={action} className="space-y-3" aria-label="Disposition">
      <h3 className="font-semibold">Disposition</h3>
      {state.message ? <Notice kind={state.ok ? "done" : "problem"}>{state.message}</Notice> : null}
      {withinNote ? <p className="text-xs text-ink-600">Not complete and within: {withinNote}. It can be accepted only with a concession.</p> : null}
      <input type="hidden" name="unitId" value={unitId} />
      <Field label="New disposition" error={errors.to}>
        <Select name="to" defaultValue={initial} onChange={(e) => setTo(e.target.value as DispositionKey)}>
          {Object.entries(DISPOSITION_LABELS).map(([value, label]) => <option key={value} value={value}>{label}</option>)}
        </Select>
      </Field>
      <Field label="Reason for the record" hint="Every change of disposition needs a reason; clients do not see it." error={errors.reason}>
        <TextArea name="reason" maxLength={2000} defaultValue={state.ok ? "" : state.values?.reason ?? ""} />
      </Field>
      {to === "accepted-with-concession" ? (
        <Field label="Client's concession reference" error={errors.concessionRef}>
          <TextInput name="concessionRef" maxLength={120} defaultValue={state.ok ? "" : state.values?.concessionRef ?? ""} />
        </Field>
      ) : null}
      {signed ? (
        <Field label="Your password, to sign" hint="A concession, a scrap and reopening a closed unit are signed with your name, role and the time." error={errors.password}>
          <TextInput name="password" type="password" autoComplete="current-password" maxLength={1024} />
        </Field>
      ) : null}
      <Button type="submit" disabled={pending}>{pending ? "Recording…" : signed ? "Sign and record" : "Record disposition"}</Button>
    </form>
  );
}
