"use client";

import { useActionState } from "react";
import { EMPTY_FORM, type FormState } from "@/components/ratings/form-state";
import { Button } from "@/components/ui/button";
import { Field, TextArea, TextInput } from "@/components/ui/field";
import { Notice } from "@/components/ui/notice";
import { saveClientAction } from "../actions";

type Client = { id: string; name: string; address: string; contactEmail: string; referenceCode: string };

/** New client (no `client`) or the edit form of one. */
export function ClientForm({ client }: { client?: Client }) {
  const [state, action, pending] = useActionState<FormState, FormData>(saveClientAction, EMPTY_FORM);
  const v = (k: keyof Client) => state.values?.[k] ?? client?.[k] ?? "";
  const err = state.fieldErrors ?? {};
  return (
    <form key={state.message} action={action} className="grid gap-4 md:grid-cols-2" aria-label={client ? `Edit ${client.name}` : "New client"}>
      {state.message ? <div className="md:col-span-2"><Notice kind={state.ok ? "done" : "problem"}>{state.message}</Notice></div> : null}
      {client ? <input type="hidden" name="clientId" value={client.id} /> : null}
      <Field label="Client name" error={err.name}><TextInput name="name" required defaultValue={v("name")} /></Field>
      <Field label="Their reference code" hint="The code the client uses for itself (on its purchase orders)." error={err.referenceCode}>
        <TextInput name="referenceCode" defaultValue={v("referenceCode")} />
      </Field>
      <Field label="Contact e-mail" error={err.contactEmail}><TextInput name="contactEmail" type="email" defaultValue={v("contactEmail")} /></Field>
      <Field label="Address" error={err.address}><TextArea name="address" defaultValue={v("address")} /></Field>
      <div className="md:col-span-2"><Button type="submit" disabled={pending}>{pending ? "Saving…" : client ? "Save client" : "Add client"}</Button></div>
    </form>
  );
}
