"use client";

import { useActionState } from "react";
import { EMPTY_FORM, type FormState } from "@/components/ratings/form-state";
import { Button } from "@/components/ui/button";
import { Field, Select, TextArea, TextInput } from "@/components/ui/field";
import { Notice } from "@/components/ui/notice";
import { saveInstrumentAction } from "../actions";

export type InstrumentFormValues = {
  id: string; kind: string; make: string; model: string; serial: string; assetTag: string;
  calibratedOn: string | null; calibrationDue: string | null; calibrationNote: string; spec: Record<string, number | string | undefined>;
};

const KINDS: [string, string][] = [["oscilloscope", "Oscilloscope"], ["voltage-probe", "Voltage probe"], ["current-probe", "Current probe"], ["daq", "DAQ unit"], ["tachometer", "Tachometer"]];
const SPEC: [string, string, string][] = [
  ["gainPercentOfReading", "Gain accuracy, ± % of reading", "Vertical gain (scope, DAQ) or ratio tolerance (probe)."],
  ["offset", "Offset, ± in the offset unit", "A fixed error, e.g. a fraction of a division times V/div."],
  ["bandwidthHz", "Bandwidth, Hz", "Recorded for the register; not part of the budget."],
  ["timebasePpm", "Timebase accuracy, ± ppm", "Sampling clock; gives the frequency's uncertainty."],
  ["speedPercentOfReading", "Speed-reading accuracy, ± % of reading", "Tachometers."],
  ["speedOffsetRpm", "Speed-reading offset, ± rpm", "Tachometers: a fixed count error."],
];

/** New instrument (no `instrument`) or the edit form of one. Field names are the server schema's paths. */
export function InstrumentForm({ instrument }: { instrument?: InstrumentFormValues }) {
  const [state, action, pending] = useActionState<FormState, FormData>(saveInstrumentAction, EMPTY_FORM);
  const v = (k: string, fallback: string | number | null | undefined) => state.values?.[k] ?? (fallback === null || fallback === undefined ? "" : String(fallback));
  const err = state.fieldErrors ?? {};
  return (
    <form key={state.message} action={action} className="grid gap-4 md:grid-cols-3" aria-label={instrument ? `Edit ${instrument.assetTag}` : "New instrument"}>
      {state.message ? <div className="md:col-span-3"><Notice kind={state.ok ? "done" : "problem"}>{state.message}</Notice></div> : null}
      {instrument ? <input type="hidden" name="instrumentId" value={instrument.id} /> : null}
      <Field label="Kind" error={err.kind}>
        <Select name="kind" defaultValue={v("kind", instrument?.kind ?? "oscilloscope")}>{KINDS.map(([k, l]) => <option key={k} value={k}>{l}</option>)}</Select>
      </Field>
      <Field label="Make" error={err.make}><TextInput name="make" required defaultValue={v("make", instrument?.make)} /></Field>
      <Field label="Model" error={err.model}><TextInput name="model" required defaultValue={v("model", instrument?.model)} /></Field>
      <Field label="Serial" error={err.serial}><TextInput name="serial" required defaultValue={v("serial", instrument?.serial)} /></Field>
      <Field label="Asset tag" hint="The lab's own label; the bench API accepts it in place of the id." error={err.assetTag}><TextInput name="assetTag" required defaultValue={v("assetTag", instrument?.assetTag)} /></Field>
      <Field label="Offset unit" error={err["spec.offsetUnit"]}>
        <Select name="spec.offsetUnit" defaultValue={v("spec.offsetUnit", instrument?.spec.offsetUnit as string | undefined)}><option value="">—</option><option value="V">V</option><option value="A">A</option><option value="rpm">rpm</option></Select>
      </Field>
      {SPEC.map(([key, label, hint]) => (
        <Field key={key} label={label} hint={hint} error={err[`spec.${key}`]}>
          <TextInput name={`spec.${key}`} inputMode="decimal" defaultValue={v(`spec.${key}`, instrument?.spec[key])} />
        </Field>
      ))}
      <Field label="Calibration date" error={err.calibratedOn}><TextInput name="calibratedOn" type="date" defaultValue={v("calibratedOn", instrument?.calibratedOn)} /></Field>
      <Field label="Calibration due" error={err.calibrationDue}><TextInput name="calibrationDue" type="date" defaultValue={v("calibrationDue", instrument?.calibrationDue)} /></Field>
      <Field label="Certificate note" hint="Calibrating lab and certificate number." error={err.calibrationNote}><TextArea name="calibrationNote" defaultValue={v("calibrationNote", instrument?.calibrationNote)} /></Field>
      <div className="md:col-span-3"><Button type="submit" disabled={pending}>{pending ? "Saving…" : instrument ? "Save instrument" : "Add instrument"}</Button></div>
    </form>
  );
}
