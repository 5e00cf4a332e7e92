"use server";

import { revalidatePath } from "next/cache";
import { redirect } from "next/navigation";
import { HttpError } from "@/lib/auth/guards";
import { requireRoleActor } from "@/lib/dal/actor";
import { createUnit, editUnit, editUnitSchema, findSimilarSerials, newUnitSchema, retireUnit, retireUnitSchema } from "@/lib/dal/unit-admin";
import { asForm } from "@/lib/forms/fields";

export type UnitFormState = { ok: boolean; message: string; similar?: string[] };

const issues = (e: { issues: { path: PropertyKey[]; message: string }[] }) => e.issues.map((i) => `${String(i.path[0] ?? "")}: ${i.message}`).join("; ");

/** Registers a unit; a serial close to one on file must be confirmed. */
export async function createUnitAction(_prev: UnitFormState, form: FormData): Promise<UnitFormState> {
  form = asForm(form);
  const actor = await requireRoleActor("admin", "operator");
  const raw = { serial: form.get("serial"), ratingId: form.get("ratingId"), confirmNew: form.get("confirmNew") === "on" };
  const parsed = newUnitSchema.safeParse(raw);
  if (!parsed.success) {
    const similar = typeof raw.serial === "string" ? await findSimilarSerials(actor, raw.serial.trim()) : [];
    return { ok: false, message: issues(parsed.error), similar };
  }
  let id: string;
  try {
    id = (await createUnit(actor, parsed.data)).id;
  } catch (err) {
    if (err instanceof HttpError) return { ok: false, message: err.message };
    throw err;
  }
  revalidatePath("/units");
  redirect(`/units/${id}`);
}

export async function editUnitAction(_prev: UnitFormState, form: FormData): Promise<UnitFormState> {
  form = asForm(form);
  const actor = await requireRoleActor("admin", "qa");
  const unitId = String(form.get("unitId") ?? "");
  const parsed = editUnitSchema.safeParse({ serial: form.get("serial") || undefined, ratingId: form.get("ratingId") || undefined, reason: form.get("reason") });
  if (!parsed.success) return { ok: false, message: issues(parsed.error) };
  try {
    await editUnit(actor, unitId, parsed.data);
  } catch (err) {
    if (err instanceof HttpError) return { ok: false, message: err.message };
    throw err;
  }
  revalidatePath(`/units/${unitId}`);
  return { ok: true, message: "Unit updated; the change is in its history." };
}

export async function retireUnitAction(_prev: UnitFormState, form: FormData): Promise<UnitFormState> {
  form = asForm(form);
  const actor = await requireRoleActor("admin", "qa");
  const unitId = String(form.get("unitId") ?? "");
  const parsed = retireUnitSchema.safeParse({ retired: form.get("retired") === "true", reason: form.get("reason") });
  if (!parsed.success) return { ok: false, message: issues(parsed.error) };
  try {
    await retireUnit(actor, unitId, parsed.data);
  } catch (err) {
    if (err instanceof HttpError) return { ok: false, message: err.message };
    throw err;
  }
  revalidatePath(`/units/${unitId}`);
  revalidatePath("/units");
  return { ok: true, message: parsed.data.retired ? "Unit retired." : "Unit restored." };
}
