"use server";

import { revalidatePath } from "next/cache";
import { headers } from "next/headers";
import { clientAddressFrom } from "@/lib/auth/client-address";
import { HttpError, requireRole } from "@/lib/auth/guards";
import { requirePageActor } from "@/lib/dal/actor";
import { changeDisposition, dispositionFormSchema } from "@/lib/dal/dispositions";
import { InputError } from "@/lib/dal/setup-access";
import { addUnitNote, noteFormSchema } from "@/lib/dal/unit-notes";
import { DISPOSITION_WORDS } from "@/lib/units/disposition-rules";
import { asForm } from "@/lib/forms/fields";

export type DispositionState = {
  ok: boolean; message: string;
  fieldErrors?: Record<string, string>;
  /** Echoed back (never the password) so the form shows what was typed after React resets it. */
  values?: { to: string; reason: string; concessionRef: string };
};

function fieldErrorsOf(issues: readonly { path: PropertyKey[]; message: string }[]): Record<string, string> {
  const out: Record<string, string> = {};
  for (const i of issues) out[String(i.path[0] ?? "form")] ??= i.message;
  return out;
}

/** A disposition: parsed here, judged by the rules and signed in the DAL (which checks the session again). */
export async function setDisposition(_prev: DispositionState, form: FormData): Promise<DispositionState> {
  form = asForm(form);
  await requireRole("qa", "admin");
  const raw = Object.fromEntries(form);
  const values = { to: String(raw.to ?? ""), reason: String(raw.reason ?? ""), concessionRef: String(raw.concessionRef ?? "") };
  const parsed = dispositionFormSchema.safeParse(raw);
  if (!parsed.success) {
    const fieldErrors = fieldErrorsOf(parsed.error.issues);
    return { ok: false, message: Object.values(fieldErrors).join(" "), fieldErrors, values };
  }
  let signed = false;
  try {
    const address = clientAddressFrom(await headers());
    signed = (await changeDisposition(await requirePageActor(), parsed.data, address)).signed;
  } catch (err) {
    if (err instanceof InputError) return { ok: false, message: Object.values(err.fields).join(" "), fieldErrors: err.fields, values };
    if (err instanceof HttpError) return { ok: false, message: err.message, values };
    throw err;
  }
  revalidatePath(`/units/${parsed.data.unitId}`);
  revalidatePath("/review");
  return { ok: true, message: `Disposition recorded: ${DISPOSITION_WORDS[parsed.data.to]}${signed ? ", signed" : ""}.` };
}

export type NoteState = { ok: boolean; message: string; values?: { visibility: string; body: string } };

/** A note on the unit, internal (lab only) or for the client, chosen when it is written. */
export async function addNote(_prev: NoteState, form: FormData): Promise<NoteState> {
  form = asForm(form);
  await requireRole("admin", "operator", "qa");
  const raw = Object.fromEntries(form);
  const values = { visibility: String(raw.visibility ?? ""), body: String(raw.body ?? "") };
  const parsed = noteFormSchema.safeParse(raw);
  if (!parsed.success) return { ok: false, message: parsed.error.issues.map((i) => i.message).join("; "), values };
  try {
    await addUnitNote(await requirePageActor(), parsed.data);
  } catch (err) {
    if (err instanceof HttpError) return { ok: false, message: err.message, values };
    throw err;
  }
  revalidatePath(`/units/${parsed.data.unitId}`);
  return { ok: true, message: parsed.data.visibility === "client" ? "Note added; the client sees it." : "Internal note added; only the lab sees it." };
}
