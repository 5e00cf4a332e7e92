"use server";

import { revalidatePath } from "next/cache";
import { z } from "zod";
import { recordDisposition } from "@/db/queries/unit-events";
import { requireRole } from "@/lib/auth/guards";
import { scopeFor } from "@/lib/dal/scope";

const dispositionSchema = z.object({
  unitId: z.uuid(),
  to: z.enum(["open", "accepted", "accepted-with-concession", "rework", "scrapped"]),
  comment: z.string().trim().max(2000),
});

export type DispositionState = { ok: boolean; message: string };

export async function setDisposition(_prev: DispositionState, form: FormData): Promise<DispositionState> {
  const user = await requireRole("qa", "admin");
  const parsed = dispositionSchema.safeParse(Object.fromEntries(form));
  if (!parsed.success) return { ok: false, message: "Pick a disposition." };
  const { unitId, to, comment } = parsed.data;
  if (to !== "accepted" && to !== "open" && comment.length < 5) {
    return { ok: false, message: "Say why: a concession, rework or scrap needs a comment for the record." };
  }
  const done = await recordDisposition(scopeFor(user), unitId, user.id, to, comment);
  if (!done) return { ok: false, message: "That unit is not one your lab tests." };
  revalidatePath(`/units/${unitId}`);
  revalidatePath("/review");
  return { ok: true, message: "Disposition recorded." };
}
