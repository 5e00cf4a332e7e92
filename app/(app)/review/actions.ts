"use server";

import { revalidatePath } from "next/cache";
import { headers } from "next/headers";
import { z } from "zod";
import { clientAddressFrom } from "@/lib/auth/client-address";
import { HttpError, requireRole } from "@/lib/auth/guards";
import { requirePageActor } from "@/lib/dal/actor";
import { bulkDispositionSchema, changeDispositions } from "@/lib/dal/dispositions";
import { assignForReview, assignSchema } from "@/lib/dal/review";
import { asForm } from "@/lib/forms/fields";
import { DISPOSITION_WORDS } from "@/lib/units/disposition-rules";

export type QueueState = { ok: boolean; message: string; results?: { unitId: string; ok: boolean; message: string }[] };

const intentSchema = z.enum(["take", "assign", "disposition"], "Choose what to do with the ticked units");
const firstMessage = (error: z.ZodError) => error.issues.map((i) => i.message).join("; ");

/** The review queue's actions on the ticked units: take them, assign them, or give them one disposition with one reason. */
export async function actOnQueue(_prev: QueueState, form: FormData): Promise<QueueState> {
  form = asForm(form);
  await requireRole("qa", "admin");
  const intent = intentSchema.safeParse(form.get("intent"));
  if (!intent.success) return { ok: false, message: firstMessage(intent.error) };
  const unitIds = form.getAll("unitIds").map(String);
  const actor = await requirePageActor();
  try {
    if (intent.data === "disposition") {
      const parsed = bulkDispositionSchema.safeParse({ unitIds, to: form.get("to"), reason: form.get("reason") ?? "" });
      if (!parsed.success) return { ok: false, message: firstMessage(parsed.error) };
      const results = await changeDispositions(actor, parsed.data, clientAddressFrom(await headers()));
      revalidatePath("/review");
      const done = results.filter((r) => r.ok).length;
      return {
        ok: done === results.length,
        message: `${done} of ${results.length} units now ${DISPOSITION_WORDS[parsed.data.to]}.${done < results.length ? " The others were left as they were:" : ""}`,
        results: results.map((r) => ({ unitId: r.serialOrId, ok: r.ok, message: r.message })),
      };
    }
    const assigneeId = intent.data === "take" ? actor.userId : form.get("assigneeId");
    const parsed = assignSchema.safeParse({ unitIds, assigneeId });
    if (!parsed.success) return { ok: false, message: firstMessage(parsed.error) };
    const n = await assignForReview(actor, parsed.data);
    revalidatePath("/review");
    return { ok: true, message: intent.data === "take" ? `You took ${n} unit${n === 1 ? "" : "s"}.` : `${n} unit${n === 1 ? "" : "s"} assigned.` };
  } catch (err) {
    if (err instanceof HttpError) return { ok: false, message: err.message };
    throw err;
  }
}
