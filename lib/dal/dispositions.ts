import "server-only";
import { z } from "zod";
import { getDispositionFacts, recordDisposition } from "@/db/queries/unit-events";
import { HttpError } from "@/lib/auth/guards";
import { BULK_DISPOSITIONS, decideDisposition, DISPOSITION_WORDS, DISPOSITIONS, type DispositionValue } from "@/lib/units/disposition-rules";
import type { Actor } from "./actor";
import { InputError } from "./setup-access";
import { signWithPassword } from "./signatures";

export const dispositionFormSchema = z.object({
  unitId: z.uuid("Pick a unit"),
  to: z.enum(DISPOSITIONS, "Pick a disposition"),
  reason: z.string("Say why").trim().max(2000, "Keep the reason under 2000 characters"),
  concessionRef: z.string().trim().max(120, "Keep the concession reference under 120 characters").default(""),
  password: z.string().max(1024, "That password is too long").default(""),
});

export type DispositionInput = z.output<typeof dispositionFormSchema>;

/** Lab managers and quality engineers of the unit's lab decide dispositions; everyone else is refused (403). */
function requireDisposer(actor: Actor): { scope: Actor["scope"] & { kind: "lab" }; userId: string } {
  if (actor.scope.kind !== "lab" || actor.role === "station" || !actor.userId || (actor.role !== "qa" && actor.role !== "admin")) {
    throw new HttpError(403, "Only quality engineers and lab managers decide a unit's disposition.");
  }
  return { scope: actor.scope, userId: actor.userId };
}

/**
 * Changes a unit's disposition under the rules (lib/units/disposition-rules.ts): a reason every time, a
 * concession reference for a concession, a password signature for a concession, a scrap or a reopening.
 * A refusal is an InputError naming the field; a wrong password is signWithPassword's 403 (counted).
 */
export async function changeDisposition(actor: Actor, input: DispositionInput, address: string): Promise<{ to: DispositionValue; signed: boolean }> {
  const { scope, userId } = requireDisposer(actor);
  const facts = await getDispositionFacts(scope, input.unitId);
  if (!facts) throw new HttpError(404, "No such unit.");
  const decision = decideDisposition(facts, input);
  if (!decision.allowed) throw new InputError({ [decision.field]: decision.message });
  let signatureId: string | null = null;
  if (decision.signature) {
    if (!input.password) throw new InputError({ password: `Re-enter your password to sign: ${DISPOSITION_WORDS[input.to]} is a signed decision.` });
    const signature = await signWithPassword(actor, { password: input.password, purpose: decision.signature, subjectKind: "unit", subjectId: facts.id, address });
    signatureId = signature.id;
  }
  const outcome = await recordDisposition(scope, facts.id, { ...input, actorId: userId, expectedFrom: facts.disposition, signatureId });
  if (outcome === "out-of-scope") throw new HttpError(404, "No such unit.");
  if (outcome !== "recorded") throw new HttpError(409, "The unit changed while you were deciding: look at it again and repeat the decision.");
  return { to: input.to, signed: signatureId !== null };
}

export const bulkDispositionSchema = z.object({
  unitIds: z.array(z.uuid("Pick units from the list")).min(1, "Tick at least one unit").max(200, "At most 200 units at once"),
  to: z.enum(BULK_DISPOSITIONS as [DispositionValue, ...DispositionValue[]], "A bulk change may only accept or return for rework: concessions, scrapping and reopening are signed one unit at a time"),
  reason: z.string("Say why").trim().max(2000, "Keep the reason under 2000 characters"),
});

export type BulkOutcome = { serialOrId: string; ok: boolean; message: string };

/**
 * The same disposition and reason for several units; each unit is judged by the same rules as alone,
 * so a unit the rules refuse is reported and left as it was while the others change.
 */
export async function changeDispositions(actor: Actor, input: z.output<typeof bulkDispositionSchema>, address: string): Promise<BulkOutcome[]> {
  requireDisposer(actor);
  const results: BulkOutcome[] = [];
  for (const unitId of new Set(input.unitIds)) {
    try {
      await changeDisposition(actor, { unitId, to: input.to, reason: input.reason, concessionRef: "", password: "" }, address);
      results.push({ serialOrId: unitId, ok: true, message: `Now ${DISPOSITION_WORDS[input.to]}.` });
    } catch (err) {
      if (!(err instanceof HttpError)) throw err;
      results.push({ serialOrId: unitId, ok: false, message: err instanceof InputError ? Object.values(err.fields).join(" ") : err.message });
    }
  }
  return results;
}
