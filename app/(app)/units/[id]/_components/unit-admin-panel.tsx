"use client";

import { useActionState } from "react";
import { Button } from "@/components/ui/button";
import { ConfirmButton } from "@/components/ui/confirm-button";
import { Field, Select, TextInput } from "@/components/ui/field";
import { Notice } from "@/components/ui/notice";
import { editUnitAction, retireUnitAction, type UnitFormState } from "../../unit-actions";

type Props = { unitId: string; serial: string; ratingId: string; retired: boolean; ratings: { id: string; label: string }[] };

/** Lab managers and quality engineers correct a unit's serial or rating, or retire a unit registered by mistake. */
export function UnitAdminPanel({ unitId, serial, ratingId, retired, ratings }: Props) {
  const [edit, editAction, editing] = useActionState<UnitFormState, FormData>(editUnitAction, { ok: false, message: "" });
  const [retire, retireAction, retiring] = useActionState<UnitFormState, FormData>(retireUnitAction, { ok: false, message: "" });
  return (
    <details className="mt-6 rounded-lg bg-white p-5 shadow-sm ring-1 ring-ink-200">
      <summary className="cursor-pointer font-semibold">Edit or retire this unit</summary>
      <form action={editAction} className="mt-3 grid gap-3 md:grid-cols-3">
        <input type="hidden" name="unitId" value={unitId} />
        <Field label="Serial number"><TextInput name="serial" defaultValue={serial} maxLength={64} /></Field>
        <Field label="Rating (the client follows it)">
          <Select name="ratingId" defaultValue={ratingId}>{ratings.map((r) => <option key={r.id} value={r.id}>{r.label}</option>)}</Select>
        </Field>
        <Field label="Why"><TextInput name="reason" required minLength={5} maxLength={1000} /></Field>
        <div className="md:col-span-3"><Button type="submit" tone="quiet" disabled={editing}>Save the change</Button></div>
        {edit.message ? <div className="md:col-span-3"><Notice kind={edit.ok ? "done" : "problem"}>{edit.message}</Notice></div> : null}
      </form>
      <form action={retireAction} className="mt-4 grid gap-3 border-t border-ink-100 pt-4 md:grid-cols-3">
        <input type="hidden" name="unitId" value={unitId} />
        <input type="hidden" name="retired" value={retired ? "false" : "true"} />
        <Field label={retired ? "Why restore it" : "Why retire it (e.g. registered by mistake)"}><TextInput name="reason" required minLength={5} maxLength={1000} /></Field>
        <div className="self-end">
          {retired ? <Button type="submit" tone="quiet" disabled={retiring}>Restore the unit</Button> : (
            <ConfirmButton key="retire" label="Retire the unit" question="Retire this unit? Its captures and history stay, but no new captures can be sent for it." confirmLabel="Yes, retire it" disabled={retiring}
              className="inline-flex items-center justify-center rounded-md bg-outside-700 px-4 py-2 text-sm font-semibold text-white hover:opacity-90 disabled:bg-ink-400" />
          )}
        </div>
        {retire.message ? <div className="md:col-span-3"><Notice kind={retire.ok ? "done" : "problem"}>{retire.message}</Notice></div> : null}
      </form>
    </details>
  );
}
