"use client";

import { useActionState, useState } from "react";
import {
  CONNECTION_LABELS, CONNECTIONS, KE_BASES, KE_BASIS_LABELS, MACHINE_KIND_LABELS, MACHINE_KINDS, MAGNET_MATERIAL_LABELS, MAGNET_MATERIALS,
  VOLTAGE_BASES, VOLTAGE_BASIS_LABELS, type Rating,
} from "@/lib/analysis";
import { Button } from "@/components/ui/button";
import { Field, Select, TextInput } from "@/components/ui/field";
import { Notice } from "@/components/ui/notice";
import { EMPTY_FORM, type FormState } from "./form-state";

type Choice = { id: string; label: string; summary?: string };
type Props = {
  action: (prev: FormState, form: FormData) => Promise<FormState>;
  /** New ratings pick a client and a preset; an edit keeps both. */
  clients?: Choice[];
  presets?: Choice[];
  rating?: { id: string; modelCode: string; title: string; nameplate: Rating };
};

const str = (n: number | undefined) => (n === undefined ? "" : String(n));

/** The nameplate form (names are the dotted paths the server's schema reports errors on). */
export function RatingForm({ action, clients, presets, rating }: Props) {
  const [state, formAction, pending] = useActionState<FormState, FormData>(action, EMPTY_FORM);
  const n = rating?.nameplate;
  const v = (name: string, fallback: string) => state.values?.[name] ?? fallback;
  const e = state.fieldErrors ?? {};
  const [kind, setKind] = useState(v("nameplate.machineKind", n?.machineKind ?? "wound-field-alternator"));
  const pm = kind !== "wound-field-alternator";
  const text = (name: string, label: string, fallback: string, hint?: string, error?: string) => (
    <Field label={label} hint={hint} error={error ?? e[name]}><TextInput name={name} defaultValue={v(name, fallback)} inputMode={name.startsWith("nameplate.") ? "decimal" : undefined} /></Field>
  );
  return (
    <form key={state.message} action={formAction} className="grid gap-4 md:grid-cols-3" aria-label={rating ? "Edit nameplate" : "New rating"}>
      {state.message ? <div className="md:col-span-3"><Notice kind={state.ok ? "done" : "problem"}>{state.message}</Notice></div> : null}
      {rating ? <input type="hidden" name="ratingId" value={rating.id} /> : null}
      {clients ? (
        <Field label="Client" error={e.clientId}>
          <Select name="clientId" defaultValue={v("clientId", "")}>
            <option value="">Choose the client…</option>
            {clients.map((c) => <option key={c.id} value={c.id}>{c.label}</option>)}
          </Select>
        </Field>
      ) : null}
      <Field label="Model code" error={e.modelCode}><TextInput name="modelCode" defaultValue={v("modelCode", rating?.modelCode ?? "")} /></Field>
      <Field label="Title" error={e.title}><TextInput name="title" defaultValue={v("title", rating?.title ?? "")} /></Field>
      <Field label="Machine kind" error={e["nameplate.machineKind"]}>
        <Select name="nameplate.machineKind" value={kind} onChange={(ev) => setKind(ev.target.value)}>
          {MACHINE_KINDS.map((k) => <option key={k} value={k}>{MACHINE_KIND_LABELS[k]}</option>)}
        </Select>
      </Field>
      <Field label="Phases" error={e["nameplate.phases"]}>
        <Select name="nameplate.phases" defaultValue={v("nameplate.phases", str(n?.phases ?? 3))}>
          {[1, 2, 3].map((p) => <option key={p} value={p}>{p}</option>)}
        </Select>
      </Field>
      <Field label="Connection" error={e["nameplate.connection"]}>
        <Select name="nameplate.connection" defaultValue={v("nameplate.connection", n?.connection ?? "star")}>
          {CONNECTIONS.map((c) => <option key={c} value={c}>{CONNECTION_LABELS[c]}</option>)}
        </Select>
      </Field>
      {text("nameplate.poles", "Poles", str(n?.poles))}
      {text("nameplate.ratedSpeedRpm", "Rated speed, rpm", str(n?.ratedSpeedRpm))}
      {text("nameplate.frequencyHz", "Rated frequency, Hz", str(n?.frequencyHz), "f = poles × rpm / 120")}
      {text("nameplate.nominalVoltageV", "Rated voltage, V", str(n?.nominalVoltageV))}
      <Field label="Voltage basis" error={e["nameplate.voltageBasis"]}>
        <Select name="nameplate.voltageBasis" defaultValue={v("nameplate.voltageBasis", n?.voltageBasis ?? "line-line-rms")}>
          {VOLTAGE_BASES.map((b) => <option key={b} value={b}>{VOLTAGE_BASIS_LABELS[b]}</option>)}
        </Select>
      </Field>
      {text("nameplate.ratedKva", "Rated apparent power, kVA", str(n?.ratedKva), "Give kVA, kW or both")}
      {text("nameplate.ratedKw", "Rated power, kW", str(n?.ratedKw))}
      {pm ? (
        <>
          {text("nameplate.ke.value", "Nominal Ke", str(n?.ke?.value), "In the basis chosen beside it", e["nameplate.ke.value"] ?? e["nameplate.ke"])}
          <Field label="Ke basis" error={e["nameplate.ke.basis"]}>
            <Select name="nameplate.ke.basis" defaultValue={v("nameplate.ke.basis", n?.ke?.basis ?? "line-line-rms-per-krpm")}>
              {KE_BASES.map((b) => <option key={b} value={b}>{KE_BASIS_LABELS[b]}</option>)}
            </Select>
          </Field>
          <Field label="Magnet material" error={e["nameplate.magnetMaterial"]}>
            <Select name="nameplate.magnetMaterial" defaultValue={v("nameplate.magnetMaterial", n?.magnetMaterial ?? "")}>
              <option value="">Not stated</option>
              {MAGNET_MATERIALS.map((m) => <option key={m} value={m}>{MAGNET_MATERIAL_LABELS[m]}</option>)}
            </Select>
          </Field>
          {text("nameplate.magnetReferenceC", "Ke reference temperature, °C", str(n?.magnetReferenceC), "The magnet temperature the nominal Ke refers to")}
        </>
      ) : null}
      {presets ? (
        <div className="md:col-span-3">
          <Field label="Start the tolerance profile from" error={e.presetId} hint="Version 1 of the profile; every band can be edited afterwards.">
            <Select name="presetId" defaultValue={v("presetId", "lab-own")}>
              {presets.map((p) => <option key={p.id} value={p.id}>{p.label} — {p.summary}</option>)}
            </Select>
          </Field>
        </div>
      ) : null}
      <div className="md:col-span-3"><Button type="submit" disabled={pending}>{pending ? "Saving…" : rating ? "Save nameplate" : "Create rating"}</Button></div>
    </form>
  );
}
