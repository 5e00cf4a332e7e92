"use server";

import { revalidatePath } from "next/cache";
import { z } from "zod";
import { requireRole } from "@/lib/auth/guards";
import { recordUnitDisposition } from "@/lib/dal/dispositions";
import { asForm } from "@/lib/forms/fields";

const dispositionSchema = z.object({
  unitId: z.uuid(),
  to: z.enum(["open", "accepted", "accepted-with-concession", "rework", "scrapped"]),
  comment: z.string().trim().max(2000),
});

export type DispositionState = { ok: boolean; message: string; values?: { to: string; comment: string } };

export async function setDisposition(_prev: DispositionState, form: FormData): Promise<DispositionState> {
  form = asForm(form);
  await requireRole("qa", "admin");
  const parsed = dispositionSchema.safeParse(Object.fromEntries(form));
  if (!parsed.success) return { ok: false, message: "Pick a disposition." };
  const { unitId, to, comment } = parsed.data;
  // Echoed back so the form shows what was typed after React resets it.
  const values = { to, comment };
  if (to !== "accepted" && to !== "open" && comment.length < 5) {
    return { ok: false, message: "Say why: a concession, rework or scrap needs a comment for the record.", values };
  }
  const outcome = await recordUnitDisposition(unitId, to, comment);
  if (outcome === "out-of-scope") return { ok: false, message: "That unit is not one your lab tests.", values };
  if (outcome === "unchanged") return { ok: false, message: `The unit is already ${to}: pick another disposition.`, values };
  revalidatePath(`/units/${unitId}`);
  revalidatePath("/review");
  return { ok: true, message: "Disposition recorded." };
}
