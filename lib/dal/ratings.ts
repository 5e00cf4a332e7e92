import "server-only";
import { getClientForLab, listClientsForLab } from "@/db/queries/clients";
import { getRatingForLab, insertRatingWithProfile, isUniqueViolation, listRatingsForLab, modelCodeTaken, updateRatingForLab } from "@/db/queries/ratings";
import type { Rating } from "@/db/schema";
import { MACHINE_KIND_LABELS, profileFromPreset, PRESETS, ratingSchema } from "@/lib/analysis";
import { HttpError } from "@/lib/auth/guards";
import { describeNameplate } from "@/lib/ratings/describe";
import { ratingCreateSchema, ratingListQuerySchema, ratingPatchSchema } from "@/lib/ratings/input-schemas";
import type { Actor } from "./actor";
import { InputError, parseFields, requireSetupEditor, requireSetupReader } from "./setup-access";

// Ratings (machine models) of the actor's lab. Reads: lab staff and station keys; writes: lab managers
// and quality engineers. Another lab's rating answers 404 like a missing one.

export function ratingJson(row: { rating: Rating; client: string }, extra: { units?: number; profileVersion?: number | null } = {}) {
  const r = row.rating;
  const nameplate = ratingSchema.safeParse(r.nameplate);
  return {
    id: r.id, clientId: r.organisationId, client: row.client, modelCode: r.modelCode, title: r.title,
    nameplate: r.nameplate, nameplateRows: nameplate.success ? describeNameplate(nameplate.data) : [],
    machineKindLabel: MACHINE_KIND_LABELS[r.nameplate.machineKind] ?? "Unknown machine kind",
    retiredAt: r.retiredAt, createdAt: r.createdAt, updatedAt: r.updatedAt, ...extra,
  };
}
export type RatingJson = ReturnType<typeof ratingJson>;

export async function listRatingsView(actor: Actor, rawQuery: unknown) {
  const scope = requireSetupReader(actor);
  const query = parseFields(ratingListQuerySchema, rawQuery, 400);
  const [rows, clients] = await Promise.all([
    listRatingsForLab(scope, { clientId: query.client, machineKind: query.kind, retired: query.retired }),
    listClientsForLab(scope, { includeInactive: true }),
  ]);
  return {
    query,
    ratings: rows.map((r) => ratingJson(r, { units: r.units, profileVersion: r.profileVersion === null ? null : Number(r.profileVersion) })),
    clients: clients.map((c) => ({ id: c.id, name: c.name, active: !c.deactivatedAt })),
    canEdit: actor.role === "admin" || actor.role === "qa",
  };
}

/** The lab's rating or a 404. */
export async function requireLabRating(actor: Actor, ratingId: string) {
  const scope = requireSetupReader(actor);
  const row = /^[0-9a-f-]{36}$/i.test(ratingId) ? await getRatingForLab(scope, ratingId) : undefined;
  if (!row) throw new HttpError(404, "No such rating in your lab");
  return { scope, row };
}

/** Active clients of the lab, for the new-rating form. */
export async function listClientChoices(actor: Actor) {
  const scope = requireSetupEditor(actor);
  return (await listClientsForLab(scope)).map((c) => ({ id: c.id, name: c.name }));
}

export const PRESET_CHOICES = Object.entries(PRESETS).map(([id, p]) => ({ id, label: p.label, summary: p.summary }));

async function refuseDuplicateModelCode(actor: Actor, clientId: string, modelCode: string, exceptId?: string) {
  if (await modelCodeTaken(requireSetupEditor(actor), clientId, modelCode, exceptId)) {
    throw new InputError({ modelCode: `This client already has a rating with model code ${modelCode}` }, 409);
  }
}

/** A new rating for a client of the lab, with profile version 1 built from the chosen preset. */
export async function createRating(actor: Actor, raw: unknown) {
  const scope = requireSetupEditor(actor);
  const input = parseFields(ratingCreateSchema, raw);
  const client = await getClientForLab(scope, input.clientId);
  if (!client) throw new InputError({ clientId: "Pick a client of your lab" });
  if (client.deactivatedAt) throw new InputError({ clientId: `${client.name} is deactivated: reactivate it first` });
  await refuseDuplicateModelCode(actor, input.clientId, input.modelCode);
  const profile = profileFromPreset(input.presetId, input.nameplate);
  try {
    const rating = await insertRatingWithProfile(scope, {
      clientId: input.clientId, modelCode: input.modelCode, title: input.title, nameplate: input.nameplate, profile,
      reason: `Started from the preset ${PRESETS[input.presetId].label}`, userId: actor.userId,
    });
    return ratingJson({ rating, client: client.name }, { units: 0, profileVersion: 1 });
  } catch (err) {
    if (isUniqueViolation(err)) throw new InputError({ modelCode: `This client already has a rating with model code ${input.modelCode}` }, 409);
    throw err;
  }
}

export async function updateRating(actor: Actor, ratingId: string, raw: unknown) {
  requireSetupEditor(actor);
  const { scope, row } = await requireLabRating(actor, ratingId);
  const input = parseFields(ratingPatchSchema, raw);
  if (input.modelCode !== undefined) await refuseDuplicateModelCode(actor, row.rating.organisationId, input.modelCode, ratingId);
  try {
    const updated = await updateRatingForLab(scope, ratingId, input);
    if (!updated) throw new HttpError(404, "No such rating in your lab");
    return ratingJson({ rating: updated, client: row.client });
  } catch (err) {
    if (isUniqueViolation(err)) throw new InputError({ modelCode: `This client already has a rating with model code ${input.modelCode}` }, 409);
    throw err;
  }
}

/** Retired, never deleted: its units and captures keep it; new units cannot be registered against it. */
export async function setRatingRetired(actor: Actor, ratingId: string, retired: boolean) {
  requireSetupEditor(actor);
  const { scope, row } = await requireLabRating(actor, ratingId);
  const updated = await updateRatingForLab(scope, ratingId, { retiredAt: retired ? (row.rating.retiredAt ?? new Date()) : null });
  if (!updated) throw new HttpError(404, "No such rating in your lab");
  return ratingJson({ rating: updated, client: row.client });
}
