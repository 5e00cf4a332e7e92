"use client";

import { useActionState } from "react";
import { confirmOverdueAction, saveCaptureInstrumentsAction } from "@/app/(app)/captures/[id]/instrument-actions";
import { EMPTY_FORM, type FormState } from "@/components/ratings/form-state";
import { Button } from "@/components/ui/button";
import { Field, TextArea, TextInput } from "@/components/ui/field";
import { Notice } from "@/components/ui/notice";

/** Which instruments took the capture: the lab's instruments in service, ticked. */
export function CaptureInstrumentsForm({ captureId, options, chosen }: { captureId: string; options: { id: string; label: string }[]; chosen: string[] }) {
  const [state, action, pending] = useActionState<FormState, FormData>(saveCaptureInstrumentsAction, EMPTY_FORM);
  return (
    <form action={action} aria-label="Instruments of this capture" className="space-y-2">
      {state.message ? <Notice kind={state.ok ? "done" : "problem"}>{state.message}</Notice> : null}
      <input type="hidden" name="captureId" value={captureId} />
      <div className="grid gap-1 sm:grid-cols-2">
        {options.map((o) => (
          <label key={o.id} className="flex items-center gap-2 text-sm"><input type="checkbox" name="instrumentIds" value={o.id} defaultChecked={chosen.includes(o.id)} />{o.label}</label>
        ))}
      </div>
      <Button type="submit" disabled={pending}>{pending ? "Saving…" : "Save instruments"}</Button>
    </form>
  );
}

/** Reason and password: the quality engineer's signature that the capture may still be reported. */
export function OverdueConfirmForm({ captureId }: { captureId: string }) {
  const [state, action, pending] = useActionState<FormState, FormData>(confirmOverdueAction, EMPTY_FORM);
  const err = state.fieldErrors ?? {};
  return (
    <form action={action} aria-label="Confirm overdue instrument" className="mt-3 grid gap-3 md:grid-cols-2">
      {state.message ? <div className="md:col-span-2"><Notice kind={state.ok ? "done" : "problem"}>{state.message}</Notice></div> : null}
      <input type="hidden" name="captureId" value={captureId} />
      <Field label="Why the capture may still be reported" error={err.reason}><TextArea name="reason" required defaultValue={state.values?.reason ?? ""} /></Field>
      <Field label="Your password (signature)" error={err.password}><TextInput name="password" type="password" required autoComplete="current-password" /></Field>
      <div className="md:col-span-2"><Button type="submit" disabled={pending}>{pending ? "Signing…" : "Confirm and sign"}</Button></div>
    </form>
  );
}
