"use client";

import { useActionState, useState } from "react";
import { CHECK_IDS, CHECK_LABELS, type CheckId, type CheckRule, type ToleranceProfile } from "@/lib/analysis";
import { SEQUENCE_LABELS, UNBALANCE_DEFINITION_LABELS } from "@/lib/ratings/labels";
import { Button } from "@/components/ui/button";
import { Field, Select, TextArea, TextInput } from "@/components/ui/field";
import { Notice } from "@/components/ui/notice";
import { EMPTY_FORM, type FormState } from "./form-state";

type Props = { action: (prev: FormState, form: FormData) => Promise<FormState>; ratingId: string; profile: ToleranceProfile };

const RELATIVE: CheckId[] = ["voltage", "frequency", "back-emf-constant", "pole-count"];
const MAX: CheckId[] = ["thd", "individual-harmonic", "deviation-factor", "thf"];
const str = (n: unknown) => (typeof n === "number" ? String(n) : "");
const get = (rule: CheckRule, key: string) => (rule as Record<string, unknown>)[key];

function CheckFields({ id, rule, state }: { id: CheckId; rule: CheckRule; state: FormState }) {
  const base = `profile.checks.${id}`;
  const v = (key: string, fallback: string) => state.values?.[`${base}.${key}`] ?? fallback;
  const e = (key: string) => state.fieldErrors?.[`${base}.${key}`];
  const [judged, setJudged] = useState(v("required", String(rule.required)) === "true");
  const num = (key: string, label: string) => (
    <Field label={label} error={e(key)}><TextInput name={`${base}.${key}`} inputMode="decimal" defaultValue={v(key, str(get(rule, key)))} /></Field>
  );
  const source = rule.required ? rule.source : { document: "", clause: "", verified: false };
  return (
    <fieldset className="rounded-md border border-ink-200 p-4" aria-label={CHECK_LABELS[id]}>
      <legend className="px-1 text-sm font-semibold">{CHECK_LABELS[id]}</legend>
      <div className="mb-3 flex gap-6 text-sm">
        <label><input type="radio" name={`${base}.required`} value="true" checked={judged} onChange={() => setJudged(true)} /> Judged</label>
        <label><input type="radio" name={`${base}.required`} value="false" checked={!judged} onChange={() => setJudged(false)} /> Not required</label>
        {e("required") ? <span className="text-xs font-semibold text-outside-700">{e("required")}</span> : null}
      </div>
      {judged ? (
        <div className="grid gap-3 md:grid-cols-3">
          {RELATIVE.includes(id) ? <>{num("lowerPercent", "Lower limit, % of nominal")}{num("upperPercent", "Upper limit, % of nominal")}</> : null}
          {MAX.includes(id) || id === "voltage-unbalance" ? num("maxPercent", "Limit, % at most") : null}
          {id === "voltage-unbalance" ? (
            <Field label="Definition" error={e("definition")}>
              <Select name={`${base}.definition`} defaultValue={v("definition", String(get(rule, "definition") ?? "vuf"))}>
                {Object.entries(UNBALANCE_DEFINITION_LABELS).map(([k, l]) => <option key={k} value={k}>{l}</option>)}
              </Select>
            </Field>
          ) : null}
          {id === "phase-displacement" ? num("toleranceDeg", "Tolerance, ± degrees") : null}
          {id === "phase-sequence" ? (
            <Field label="Expected sequence" error={e("expected")}>
              <Select name={`${base}.expected`} defaultValue={v("expected", String(get(rule, "expected") ?? "positive"))}>
                {Object.entries(SEQUENCE_LABELS).map(([k, l]) => <option key={k} value={k}>{l}</option>)}
              </Select>
            </Field>
          ) : null}
          {id === "tif" ? num("max", "Limit, TIF at most") : null}
          <Field label="Source document" error={e("source.document") ?? e("source")}><TextInput name={`${base}.source.document`} defaultValue={v("source.document", source.document)} /></Field>
          <Field label="Clause" error={e("source.clause")}><TextInput name={`${base}.source.clause`} defaultValue={v("source.clause", source.clause)} /></Field>
          <label className="mt-6 text-sm"><input type="checkbox" name={`${base}.source.verified`} defaultChecked={v("source.verified", String(source.verified)) === "true" || state.values?.[`${base}.source.verified`] === "on"} /> Checked against the document</label>
        </div>
      ) : (
        <Field label="Why it is not required for this rating" error={e("reason")}>
          <TextInput name={`${base}.reason`} defaultValue={v("reason", rule.required ? "" : rule.reason)} />
        </Field>
      )}
    </fieldset>
  );
}

/** Every check of the profile plus its settings and a required reason; saving makes a new version. */
export function ProfileForm({ action, ratingId, profile }: Props) {
  const [state, formAction, pending] = useActionState<FormState, FormData>(action, EMPTY_FORM);
  const e = state.fieldErrors ?? {};
  const v = (name: string, fallback: string) => state.values?.[name] ?? fallback;
  return (
    <form key={state.message} action={formAction} className="space-y-4" aria-label="Edit tolerance profile">
      {state.message ? <Notice kind={state.ok ? "done" : "problem"}>{state.message}</Notice> : null}
      <input type="hidden" name="ratingId" value={ratingId} />
      <input type="hidden" name="profile.label" value={profile.label} />
      <input type="hidden" name="profile.presetId" value={profile.presetId} />
      <div className="grid gap-3 md:grid-cols-3">
        <Field label="Marginal zone, % of the band" error={e["profile.marginalZonePercent"]} hint="Within the band but this close to a limit reads marginal.">
          <TextInput name="profile.marginalZonePercent" inputMode="decimal" defaultValue={v("profile.marginalZonePercent", String(profile.marginalZonePercent))} />
        </Field>
        <Field label="Highest harmonic order" error={e["profile.harmonicOrder"]}>
          <TextInput name="profile.harmonicOrder" inputMode="numeric" defaultValue={v("profile.harmonicOrder", String(profile.harmonicOrder))} />
        </Field>
        <Field label="Plausibility factor, ×" error={e["profile.plausibilityFactor"]} hint="A voltage or Ke this many times off the rated value is flagged.">
          <TextInput name="profile.plausibilityFactor" inputMode="decimal" defaultValue={v("profile.plausibilityFactor", String(profile.plausibilityFactor))} />
        </Field>
        <Field label="Decision rule" error={e["profile.decisionRule"]} hint="Guarded: voltage, frequency and Ke pass only at least U inside each limit (guard band w = U).">
          <Select name="profile.decisionRule" defaultValue={v("profile.decisionRule", profile.decisionRule ?? "simple")}>
            <option value="simple">Simple acceptance</option>
            <option value="guarded">Guarded acceptance, w = U</option>
          </Select>
        </Field>
      </div>
      {CHECK_IDS.map((id) => <CheckFields key={id} id={id} rule={profile.checks[id]} state={state} />)}
      <Field label="Why the profile changes" error={e.reason} hint="Kept with the new version; analyses judged earlier keep the version they used.">
        <TextArea name="reason" required defaultValue={v("reason", "")} />
      </Field>
      <Button type="submit" disabled={pending}>{pending ? "Saving…" : "Save as a new version"}</Button>
    </form>
  );
}
