import "server-only";
import { z } from "zod";
import { insertUnit, listSerialsLike, setUnitRetired, updateUnit } from "@/db/queries/unit-admin";
import { refreshUnitPlanState } from "@/db/queries/unit-plan";
import { HttpError } from "@/lib/auth/guards";
import { similarSerials } from "@/lib/units/similar-serials";
import type { Actor } from "./actor";

const serial = z.string().trim().min(1, "Give the unit's serial number").max(64).regex(/^[\w./-]+$/, "Serial numbers use letters, digits, - _ . / only");
const reason = z.string().trim().min(5, "Say why (at least 5 characters)").max(1000);

export const newUnitSchema = z.object({ serial, ratingId: z.uuid("Pick a rating"), confirmNew: z.literal(true, "Confirm that this is a new unit, not a typo of one on file") });
export const editUnitSchema = z.object({ serial: serial.optional(), ratingId: z.uuid("Pick a rating").optional(), reason });
export const retireUnitSchema = z.object({ retired: z.boolean(), reason });

function labStaff(actor: Actor, roles: readonly string[], what: string) {
  if (actor.scope.kind !== "lab" || !roles.includes(actor.role) || !actor.userId) throw new HttpError(403, `Your role may not ${what}`);
  return { scope: actor.scope, actorId: actor.userId };
}

/** Serials on file that a new serial may be a typo of, closest first. */
export async function findSimilarSerials(actor: Actor, candidate: string): Promise<string[]> {
  if (actor.scope.kind !== "lab") return [];
  return similarSerials(candidate, await listSerialsLike(actor.scope, candidate));
}

/** Registers a unit (lab managers, operators) for one of the lab's ratings in force. */
export async function createUnit(actor: Actor, input: z.output<typeof newUnitSchema>) {
  const { scope, actorId } = labStaff(actor, ["admin", "operator"], "register units");
  const created = await insertUnit(scope, { serial: input.serial, ratingId: input.ratingId, actorId });
  if (created === "no-rating") throw new HttpError(422, "ratingId: pick one of your lab's ratings in force");
  if (created === "serial-taken") throw new HttpError(409, `serial: a unit ${input.serial} is already on file`);
  return created;
}

/** Changes a unit's serial or rating (lab managers, quality engineers); the history keeps before, after and why. */
export async function editUnit(actor: Actor, unitId: string, input: z.output<typeof editUnitSchema>) {
  const { scope, actorId } = labStaff(actor, ["admin", "qa"], "edit units");
  const outcome = await updateUnit(scope, unitId, { serial: input.serial, ratingId: input.ratingId }, { actorId, reason: input.reason });
  if (outcome === "missing") throw new HttpError(404, "No such unit");
  if (outcome === "no-rating") throw new HttpError(422, "ratingId: pick one of your lab's ratings in force");
  if (outcome === "serial-taken") throw new HttpError(409, `serial: a unit ${input.serial} is already on file`);
  if (outcome === "unchanged") throw new HttpError(422, "Nothing changed: give a new serial or another rating");
  await refreshUnitPlanState(scope, unitId);
}

/** Retires a unit registered by mistake, or restores it (lab managers, quality engineers). */
export async function retireUnit(actor: Actor, unitId: string, input: z.output<typeof retireUnitSchema>) {
  const { scope, actorId } = labStaff(actor, ["admin", "qa"], "retire units");
  if (!(await setUnitRetired(scope, unitId, input.retired, { actorId, reason: input.reason }))) {
    throw new HttpError(404, input.retired ? "No such unit in service" : "No such retired unit");
  }
}
