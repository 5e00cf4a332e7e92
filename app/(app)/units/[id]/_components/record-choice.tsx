"use client";

import { useActionState } from "react";
import { Button } from "@/components/ui/button";
import { Field, Select, TextInput } from "@/components/ui/field";
import { Notice } from "@/components/ui/notice";
import { chooseRecord, type RecordChoiceState } from "../record-actions";

type Candidate = { id: string; name: string; createdAt: string };

/** Picks another capture as a step's record (or back to the latest), with a reason for the unit's history. */
export function RecordChoice({ unitId, stepId, candidates, current }: { unitId: string; stepId: string; candidates: Candidate[]; current: string | null }) {
  const [state, action, pending] = useActionState<RecordChoiceState, FormData>(chooseRecord, { ok: false, message: "" });
  if (candidates.length < 2 && !state.message) return null;
  return (
    <details className="mt-2 text-xs">
      <summary className="cursor-pointer text-ink-600">Choose the capture of record…</summary>
      <form action={action} className="mt-2 grid gap-2 md:grid-cols-3">
        <input type="hidden" name="unitId" value={unitId} />
        <input type="hidden" name="planStepId" value={stepId} />
        <Field label="Capture">
          <Select name="captureId" defaultValue={current ?? ""}>
            <option value="">The latest (default)</option>
            {candidates.map((c) => <option key={c.id} value={c.id}>{c.name} · {c.createdAt.slice(0, 16).replace("T", " ")}</option>)}
          </Select>
        </Field>
        <Field label="Why"><TextInput name="reason" required minLength={5} maxLength={1000} /></Field>
        <div className="self-end"><Button type="submit" tone="quiet" disabled={pending}>Record the choice</Button></div>
        {state.message ? <div className="md:col-span-3"><Notice kind={state.ok ? "done" : "problem"}>{state.message}</Notice></div> : null}
      </form>
    </details>
  );
}
