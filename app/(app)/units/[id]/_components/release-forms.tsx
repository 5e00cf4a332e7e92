"use client";

import { useActionState } from "react";
import { Button } from "@/components/ui/button";
import { Field, TextArea, TextInput } from "@/components/ui/field";
import { Notice } from "@/components/ui/notice";
import { releaseAction, supersedeAction, withdrawAction, type ReleaseState } from "../release-actions";

const INITIAL: ReleaseState = { ok: false, message: "" };

function Outcome({ state }: { state: ReleaseState }) {
  return state.message ? <Notice kind={state.ok ? "done" : "problem"}>{state.message}</Notice> : null;
}

function PasswordField({ state }: { state: ReleaseState }) {
  return (
    <Field label="Your password (signature)" hint="Re-enter your password to sign." error={state.fields?.password}>
      <TextInput type="password" name="password" autoComplete="current-password" required />
    </Field>
  );
}

export function ReleaseForm({ unitId }: { unitId: string }) {
  const [state, action, pending] = useActionState(releaseAction, INITIAL);
  return (
    <form action={action} className="space-y-3" aria-label="Release the report">
      <h3 className="font-semibold">Release the report</h3>
      <p className="text-sm text-ink-600">Signs as reviewed and approved for release, takes the lab&apos;s next report number and stores the PDF.</p>
      <Outcome state={state} />
      <input type="hidden" name="unitId" value={unitId} />
      <PasswordField state={state} />
      <Button type="submit" disabled={pending}>{pending ? "Releasing…" : "Sign and release"}</Button>
    </form>
  );
}

export function SupersedeForm({ unitId, number }: { unitId: string; number: string }) {
  const [state, action, pending] = useActionState(supersedeAction, INITIAL);
  return (
    <form action={action} className="space-y-3" aria-label="Issue a new revision">
      <h3 className="font-semibold">Issue a new revision of {number}</h3>
      <Outcome state={state} />
      <input type="hidden" name="unitId" value={unitId} />
      <Field label="Why this revision replaces the earlier one" error={state.fields?.reason}>
        <TextArea name="reason" maxLength={1000} required />
      </Field>
      <PasswordField state={state} />
      <Button type="submit" disabled={pending}>{pending ? "Releasing…" : "Sign and release the new revision"}</Button>
    </form>
  );
}

export function WithdrawForm({ unitId, number, revision }: { unitId: string; number: string; revision: number }) {
  const [state, action, pending] = useActionState(withdrawAction, INITIAL);
  return (
    <form action={action} className="space-y-3" aria-label="Withdraw the report">
      <h3 className="font-semibold">Withdraw {number} revision {revision}</h3>
      <Outcome state={state} />
      <input type="hidden" name="unitId" value={unitId} />
      <Field label="Why the report is withdrawn" error={state.fields?.reason}>
        <TextArea name="reason" maxLength={1000} required />
      </Field>
      <PasswordField state={state} />
      <Button type="submit" tone="danger" disabled={pending}>{pending ? "Withdrawing…" : "Sign and withdraw"}</Button>
    </form>
  );
}
