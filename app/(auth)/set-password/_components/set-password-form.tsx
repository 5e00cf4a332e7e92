"use client";

import { useActionState } from "react";
import { Button } from "@/components/ui/button";
import { Field, TextInput } from "@/components/ui/field";
import { Notice } from "@/components/ui/notice";
import { setPassword } from "../actions";

export function SetPasswordForm({ token }: { token: string }) {
  const [message, action, pending] = useActionState(setPassword, "");
  return (
    <form action={action} className="space-y-4">
      {message ? <Notice kind="problem">{message}</Notice> : null}
      <input type="hidden" name="token" value={token} />
      <Field label="New password" hint="At least 10 characters."><TextInput name="password" type="password" autoComplete="new-password" required /></Field>
      <Field label="Repeat it"><TextInput name="confirm" type="password" autoComplete="new-password" required /></Field>
      <Button type="submit" disabled={pending} className="w-full">{pending ? "Saving…" : "Save password"}</Button>
    </form>
  );
}
