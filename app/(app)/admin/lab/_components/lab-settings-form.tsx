"use client";

import { useActionState } from "react";
import { Button } from "@/components/ui/button";
import { Field, TextInput } from "@/components/ui/field";
import { Notice } from "@/components/ui/notice";
import { saveLabSettingsAction, type LabSettingsState } from "../actions";

type Values = { reportPrefix: string; nextReportNumber: string; reportFooter: string };

export function LabSettingsForm({ initial }: { initial: Values }) {
  const [state, action, pending] = useActionState<LabSettingsState, FormData>(saveLabSettingsAction, { ok: false, message: "" });
  const values = { ...initial, ...(state.ok ? {} : state.values) };
  return (
    <form key={`${state.message}-${values.reportPrefix}-${values.nextReportNumber}`} action={action} className="space-y-4">
      {state.message ? <Notice kind={state.ok ? "done" : "problem"}>{state.message}</Notice> : null}
      <Field label="Report number prefix" hint="Letters, digits, dots and dashes; unique among labs (e.g. HL-)." error={state.fields?.reportPrefix}>
        <TextInput name="reportPrefix" defaultValue={values.reportPrefix} maxLength={16} required />
      </Field>
      <Field label="Next report number" hint="Cannot go back: numbers below it may already be printed." error={state.fields?.nextReportNumber}>
        <TextInput name="nextReportNumber" type="number" min={1} defaultValue={values.nextReportNumber} required />
      </Field>
      <Field label="Line under the lab's name (accreditation, scope)" hint="Optional, up to 300 characters." error={state.fields?.reportFooter}>
        <TextInput name="reportFooter" defaultValue={values.reportFooter} maxLength={300} />
      </Field>
      <Button type="submit" disabled={pending}>{pending ? "Saving…" : "Save"}</Button>
    </form>
  );
}
