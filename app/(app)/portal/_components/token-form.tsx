"use client";

import { useActionState } from "react";
import { Button } from "@/components/ui/button";
import { Field, TextInput } from "@/components/ui/field";
import { Notice } from "@/components/ui/notice";
import { createTokenAction, type TokenState } from "../tokens/actions";

export function TokenForm() {
  const [state, action, pending] = useActionState<TokenState, FormData>(createTokenAction, { ok: false, message: "" });
  return (
    <form action={action} className="space-y-3">
      <div className="grid gap-3 sm:grid-cols-3">
        <Field label="Label" hint="What uses the token, e.g. the quality system." error={state.fieldErrors?.label}><TextInput name="label" required maxLength={80} /></Field>
        <Field label="Valid for (days)" error={state.fieldErrors?.days}><TextInput name="days" type="number" min={1} max={365} defaultValue={90} required /></Field>
        <div className="flex items-end"><Button type="submit" disabled={pending}>Create token</Button></div>
      </div>
      {state.message ? <Notice kind={state.ok ? "done" : "problem"}>{state.message}</Notice> : null}
      {state.token ? <pre className="overflow-x-auto rounded bg-ink-100 p-3 text-sm" data-testid="new-token">{state.token}</pre> : null}
    </form>
  );
}
