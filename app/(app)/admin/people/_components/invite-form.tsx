"use client";

import { useActionState } from "react";
import { Button } from "@/components/ui/button";
import { Field, Select, TextInput } from "@/components/ui/field";
import { Notice } from "@/components/ui/notice";
import { inviteUser, type InviteState } from "../actions";

type Org = { id: string; name: string; kind: "lab" | "manufacturer" };

export function InviteForm({ organisations }: { organisations: Org[] }) {
  const [state, action, pending] = useActionState<InviteState, FormData>(inviteUser, { ok: false, message: "" });
  return (
    <form key={state.message} action={action} className="grid gap-4 md:grid-cols-2">
      {state.message ? (
        <div className="md:col-span-2"><Notice kind={state.ok ? "done" : "problem"}>{state.message}</Notice></div>
      ) : null}
      <Field label="Name" error={state.fieldErrors?.name}><TextInput name="name" required defaultValue={state.values?.name} /></Field>
      <Field label="Email" error={state.fieldErrors?.email}><TextInput name="email" type="email" required defaultValue={state.values?.email} /></Field>
      <Field label="Role" error={state.fieldErrors?.role} hint="Clients read their own organisation's units only.">
        <Select name="role" defaultValue={state.values?.role ?? "operator"}>
          <option value="operator">Bench operator</option>
          <option value="qa">Quality engineer</option>
          <option value="admin">Lab manager</option>
          <option value="manufacturer">Client (read-only)</option>
        </Select>
      </Field>
      <Field label="Organisation" error={state.fieldErrors?.organisationId}>
        <Select name="organisationId" defaultValue={state.values?.organisationId}>
          {organisations.map((o) => (
            <option key={o.id} value={o.id}>{o.name}{o.kind === "lab" ? " (lab)" : ""}</option>
          ))}
        </Select>
      </Field>
      <div className="md:col-span-2"><Button type="submit" disabled={pending}>{pending ? "Sending…" : "Send invitation"}</Button></div>
    </form>
  );
}
