"use client";

import { useActionState, useState } from "react";
import { CHANNEL_ROLES, CHECK_LABELS, TEST_KINDS, type CheckId } from "@/lib/analysis";
import { CHANNEL_ROLE_LABELS, PLAN_TEST_KIND_LABELS } from "@/lib/ratings/labels";
import { Button } from "@/components/ui/button";
import { Field, Select, TextInput } from "@/components/ui/field";
import { Notice } from "@/components/ui/notice";
import { EMPTY_FORM, type FormState } from "./form-state";

type Step = { id: string; name: string; testKind: string; speedMinRpm: number; speedMaxRpm: number; requiredRoles: string[]; checks: string[] };
type Props = {
  action: (prev: FormState, form: FormData) => Promise<FormState>;
  ratingId: string;
  /** Only the checks the profile in force judges can be picked. */
  judgedChecks: CheckId[];
  ratedSpeedRpm: number;
  step?: Step;
};

/** Adds a step (no `step`) or edits one: name, test kind, speed window (min/max or speed ± %), roles, checks. */
export function PlanStepForm({ action, ratingId, judgedChecks, ratedSpeedRpm, step }: Props) {
  const [state, formAction, pending] = useActionState<FormState, FormData>(action, EMPTY_FORM);
  const e = state.fieldErrors ?? {};
  const v = (name: string, fallback: string) => state.values?.[name] ?? fallback;
  const [mode, setMode] = useState(v("speedMode", step ? "range" : "around"));
  const label = step ? `Edit step ${step.name}` : "New plan step";
  return (
    <form key={state.message} action={formAction} className="grid gap-3 md:grid-cols-4" aria-label={label}>
      {state.message ? <div className="md:col-span-4"><Notice kind={state.ok ? "done" : "problem"}>{state.message}</Notice></div> : null}
      <input type="hidden" name="ratingId" value={ratingId} />
      {step ? <input type="hidden" name="stepId" value={step.id} /> : null}
      <Field label="Step name" error={e.name}><TextInput name="name" defaultValue={v("name", step?.name ?? "")} /></Field>
      <Field label="Test kind" error={e.testKind}>
        <Select name="testKind" defaultValue={v("testKind", step?.testKind ?? "no-load")}>
          {TEST_KINDS.map((k) => <option key={k} value={k}>{PLAN_TEST_KIND_LABELS[k]}</option>)}
        </Select>
      </Field>
      <Field label="Speed window given as">
        <Select name="speedMode" value={mode} onChange={(ev) => setMode(ev.target.value)}>
          <option value="around">Speed ± %</option>
          <option value="range">Lowest and highest rpm</option>
        </Select>
      </Field>
      {mode === "around" ? (
        <div className="grid grid-cols-2 gap-2">
          <Field label="Speed, rpm" error={e.speedRpm}><TextInput name="speedRpm" inputMode="decimal" defaultValue={v("speedRpm", String(ratedSpeedRpm))} /></Field>
          <Field label="± %" error={e.speedTolerancePercent ?? e.speedMaxRpm}><TextInput name="speedTolerancePercent" inputMode="decimal" defaultValue={v("speedTolerancePercent", "2")} /></Field>
        </div>
      ) : (
        <div className="grid grid-cols-2 gap-2">
          <Field label="Lowest, rpm" error={e.speedMinRpm}><TextInput name="speedMinRpm" inputMode="decimal" defaultValue={v("speedMinRpm", step ? String(step.speedMinRpm) : "")} /></Field>
          <Field label="Highest, rpm" error={e.speedMaxRpm}><TextInput name="speedMaxRpm" inputMode="decimal" defaultValue={v("speedMaxRpm", step ? String(step.speedMaxRpm) : "")} /></Field>
        </div>
      )}
      <fieldset className="md:col-span-2 text-sm">
        <legend className="font-semibold">Channel roles a capture must carry</legend>
        <div className="mt-1 flex flex-wrap gap-x-4 gap-y-1">
          {CHANNEL_ROLES.map((r) => (
            <label key={r}><input type="checkbox" name="requiredRoles" value={r} defaultChecked={step?.requiredRoles.includes(r)} /> {CHANNEL_ROLE_LABELS[r]}</label>
          ))}
        </div>
        {e.requiredRoles ? <p className="text-xs font-semibold text-outside-700">{e.requiredRoles}</p> : null}
      </fieldset>
      <fieldset className="md:col-span-2 text-sm">
        <legend className="font-semibold">Checks that decide the step</legend>
        <div className="mt-1 flex flex-wrap gap-x-4 gap-y-1">
          {judgedChecks.map((c) => (
            <label key={c}><input type="checkbox" name="checks" value={c} defaultChecked={step ? step.checks.includes(c) : true} /> {CHECK_LABELS[c]}</label>
          ))}
        </div>
        {e.checks ? <p className="text-xs font-semibold text-outside-700">{e.checks}</p> : null}
      </fieldset>
      <div className="md:col-span-4"><Button type="submit" disabled={pending}>{pending ? "Saving…" : step ? "Save step" : "Add step"}</Button></div>
    </form>
  );
}
