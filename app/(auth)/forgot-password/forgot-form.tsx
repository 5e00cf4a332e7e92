"use client";

import { useActionState } from "react";
import { Button } from "@/components/ui/button";
import { Field, TextInput } from "@/components/ui/field";
import { Notice } from "@/components/ui/notice";
import { requestPasswordReset } from "./actions";

export function ForgotForm() {
  const [message, action, pending] = useActionState(requestPasswordReset, "");
  return (
    <form action={action} className="space-y-4">
      {message ? <Notice kind="info">{message}</Notice> : null}
      <Field label="Email"><TextInput name="email" type="email" autoComplete="username" required /></Field>
      <Button type="submit" disabled={pending} className="w-full">{pending ? "Sending…" : "Send reset link"}</Button>
    </form>
  );
}
