"use server";

import { revalidatePath } from "next/cache";
import { z } from "zod";
import { requireRoleActor } from "@/lib/dal/actor";
import { createInstrument, editInstrument, retireRegisterEntry, setBenchInstruments } from "@/lib/dal/instruments";
import { refusedForm, type SetupFormState } from "@/lib/dal/setup-access";
import { asForm } from "@/lib/forms/fields";
import { specFromForm } from "@/lib/instruments/input-schemas";

const idSchema = z.object({ instrumentId: z.uuid("No such instrument") });
const benchSchema = z.object({ stationId: z.uuid("No such bench") });

/** The register form's fields as the DAL's schema reads them (spec.* nested, empty dates null). */
function instrumentFields(form: FormData) {
  const text = (k: string) => (typeof form.get(k) === "string" ? (form.get(k) as string) : "");
  return {
    kind: text("kind"), make: text("make"), model: text("model"), serial: text("serial"), assetTag: text("assetTag"),
    calibratedOn: text("calibratedOn"), calibrationDue: text("calibrationDue"), calibrationNote: text("calibrationNote"),
    spec: specFromForm(form),
  };
}

/** Adds an instrument to the register, or (with instrumentId) edits one. Lab managers only. */
export async function saveInstrumentAction(_prev: SetupFormState, form: FormData): Promise<SetupFormState> {
  form = asForm(form);
  const actor = await requireRoleActor("admin");
  const id = form.get("instrumentId");
  let tag: string;
  try {
    if (typeof id === "string" && id !== "") {
      const parsed = idSchema.safeParse({ instrumentId: id });
      if (!parsed.success) return { ok: false, message: "No such instrument in your lab." };
      tag = (await editInstrument(actor, parsed.data.instrumentId, instrumentFields(form))).assetTag;
    } else {
      tag = (await createInstrument(actor, instrumentFields(form))).assetTag;
    }
  } catch (err) {
    return refusedForm(err, form);
  }
  revalidatePath("/admin/instruments");
  return { ok: true, message: id ? `${tag} saved.` : `${tag} added to the register.` };
}

/** Retires an instrument; the captures that used it keep it on record. */
export async function retireInstrumentAction(_prev: SetupFormState, form: FormData): Promise<SetupFormState> {
  form = asForm(form);
  const actor = await requireRoleActor("admin");
  const parsed = idSchema.safeParse({ instrumentId: form.get("instrumentId") });
  if (!parsed.success) return { ok: false, message: "No such instrument in your lab." };
  try {
    await retireRegisterEntry(actor, parsed.data.instrumentId);
  } catch (err) {
    return refusedForm(err, form);
  }
  revalidatePath("/admin/instruments");
  return { ok: true, message: "Retired: it stays on the captures that used it." };
}

/** Replaces a bench's default instrument set with the ticked instruments. */
export async function saveBenchSetAction(_prev: SetupFormState, form: FormData): Promise<SetupFormState> {
  form = asForm(form);
  const actor = await requireRoleActor("admin");
  const parsed = benchSchema.safeParse({ stationId: form.get("stationId") });
  if (!parsed.success) return { ok: false, message: "No such bench in your lab." };
  const ids = form.getAll("instrumentIds").filter((v): v is string => typeof v === "string");
  try {
    await setBenchInstruments(actor, parsed.data.stationId, ids);
  } catch (err) {
    return refusedForm(err, form);
  }
  revalidatePath("/admin/instruments");
  return { ok: true, message: "Default set saved: new captures from this bench take these instruments." };
}
