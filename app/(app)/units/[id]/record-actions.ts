"use server";

import { revalidatePath } from "next/cache";
import { requireRole } from "@/lib/auth/guards";
import { requirePageActor } from "@/lib/dal/actor";
import { HttpError } from "@/lib/auth/guards";
import { setStepRecord, stepRecordSchema } from "@/lib/dal/unit-plan";
import { asForm } from "@/lib/forms/fields";

export type RecordChoiceState = { ok: boolean; message: string };

/** A quality engineer picks the capture of record of a plan step, with a reason. */
export async function chooseRecord(_prev: RecordChoiceState, form: FormData): Promise<RecordChoiceState> {
  form = asForm(form);
  await requireRole("qa", "admin");
  const parsed = stepRecordSchema.safeParse(Object.fromEntries(form));
  if (!parsed.success) return { ok: false, message: parsed.error.issues.map((i) => i.message).join("; ") };
  try {
    await setStepRecord(await requirePageActor(), parsed.data);
  } catch (err) {
    if (err instanceof HttpError) return { ok: false, message: err.message };
    throw err;
  }
  revalidatePath(`/units/${parsed.data.unitId}`);
  return { ok: true, message: parsed.data.captureId ? "Capture of record chosen." : "The latest capture is the record again." };
}
