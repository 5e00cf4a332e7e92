"use server";

import { headers } from "next/headers";
import { revalidatePath } from "next/cache";
import { z } from "zod";
import { clientAddressFrom } from "@/lib/auth/client-address";
import { requireRoleActor } from "@/lib/dal/actor";
import { confirmOverdueCapture, setCaptureInstruments } from "@/lib/dal/capture-instruments";
import { refusedForm, type SetupFormState } from "@/lib/dal/setup-access";
import { asForm } from "@/lib/forms/fields";

const captureIdSchema = z.object({ captureId: z.uuid("No such capture") });

/** Replaces the instruments recorded for a capture with the ticked ones (lab staff). */
export async function saveCaptureInstrumentsAction(_prev: SetupFormState, form: FormData): Promise<SetupFormState> {
  form = asForm(form);
  const actor = await requireRoleActor("admin", "operator", "qa");
  const parsed = captureIdSchema.safeParse({ captureId: form.get("captureId") });
  if (!parsed.success) return { ok: false, message: "No such capture." };
  const ids = form.getAll("instrumentIds").filter((v): v is string => typeof v === "string");
  try {
    await setCaptureInstruments(actor, parsed.data.captureId, ids);
  } catch (err) {
    return refusedForm(err, form);
  }
  revalidatePath(`/captures/${parsed.data.captureId}`);
  return { ok: true, message: "Instruments saved. Analyse the capture again to bring its uncertainty up to date." };
}

/** A quality engineer's signed confirmation of a capture taken with an overdue instrument. */
export async function confirmOverdueAction(_prev: SetupFormState, form: FormData): Promise<SetupFormState> {
  form = asForm(form);
  const actor = await requireRoleActor("qa");
  const raw = { captureId: form.get("captureId"), reason: form.get("reason") ?? "", password: form.get("password") ?? "" };
  try {
    await confirmOverdueCapture(actor, raw, clientAddressFrom(await headers()));
  } catch (err) {
    const state = refusedForm(err, form);
    return { ...state, values: { reason: state.values?.reason ?? "" } };
  }
  revalidatePath(`/captures/${String(raw.captureId)}`);
  return { ok: true, message: "Confirmed and signed." };
}
