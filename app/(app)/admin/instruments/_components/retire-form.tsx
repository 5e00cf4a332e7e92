"use client";

import { useActionState } from "react";
import { EMPTY_FORM, type FormState } from "@/components/ratings/form-state";
import { Button } from "@/components/ui/button";
import { Notice } from "@/components/ui/notice";
import { retireInstrumentAction } from "../actions";

export function RetireForm({ instrumentId }: { instrumentId: string }) {
  const [state, action, pending] = useActionState<FormState, FormData>(retireInstrumentAction, EMPTY_FORM);
  return (
    <form action={action} aria-label="Retire instrument" className="space-y-2">
      {state.message ? <Notice kind={state.ok ? "done" : "problem"}>{state.message}</Notice> : null}
      <input type="hidden" name="instrumentId" value={instrumentId} />
      <p className="text-sm text-ink-600">Retiring takes it out of bench sets and new captures; captures that used it keep it on record.</p>
      <Button type="submit" disabled={pending}>{pending ? "Retiring…" : "Retire instrument"}</Button>
    </form>
  );
}
