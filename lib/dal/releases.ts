import "server-only";
import { z } from "zod";
import { insertFirstRevision, insertNextRevision, listUnitReports, withdrawLatest } from "@/db/queries/reports";
import type { Report } from "@/db/schema";
import { HttpError } from "@/lib/auth/guards";
import { SIGNING_ROLES } from "@/lib/reports/signature-meanings";
import { notifyReportEvent } from "@/lib/server/mail-report-events";
import { gatherReportInputs, type Gathered } from "@/lib/server/reports/gather";
import { renderAndStore } from "@/lib/server/reports/render";
import type { Actor } from "./actor";
import { releaseBlockersFromInstruments } from "./capture-instruments";
import { signWithPassword } from "./signatures";

// Releasing, superseding and withdrawing a unit's test report. Each asks for the signer's password;
// the number is taken inside the release transaction (db/queries/reports.ts).

const password = z.string({ error: "Enter your password to sign" }).min(1, "Enter your password to sign").max(500, "That password is too long");
const reason = (what: string) => z.string({ error: `Say why the report is ${what}` }).trim().min(5, `Say why the report is ${what} (at least 5 characters)`).max(1000, "Keep the reason under 1000 characters");

export const releaseInputSchema = z.object({ unitId: z.uuid({ error: "No such unit" }), password });
export const supersedeInputSchema = releaseInputSchema.extend({ reason: reason("replaced") });
export const withdrawInputSchema = releaseInputSchema.extend({ reason: reason("withdrawn") });

type LabActor = Actor & { scope: { kind: "lab"; labId: string }; userId: string };

function requireReleaser(actor: Actor, purpose: "release" | "supersede" | "withdraw"): asserts actor is LabActor {
  if (actor.scope.kind !== "lab" || !actor.userId || actor.role === "station" || !SIGNING_ROLES[purpose].includes(actor.role)) {
    throw new HttpError(403, "Only quality engineers and lab managers release, replace or withdraw reports.");
  }
}

/** The refusals of a release: missing unit (404), a scrapped unit, a plan with steps untested (unless accepted under concession). */
async function releasable(actor: LabActor, unitId: string): Promise<Gathered> {
  const gathered = await gatherReportInputs(actor.scope.labId, unitId);
  if (!gathered) throw new HttpError(404, "No such unit.");
  const disposition = gathered.base.unit.disposition;
  if (disposition === "scrapped") throw new HttpError(422, "The unit is scrapped: a scrapped unit gets no report.");
  if (gathered.missingSteps.length > 0 && disposition !== "accepted-with-concession") {
    throw new HttpError(422, `The test plan is incomplete; no capture of record for: ${gathered.missingSteps.join("; ")}. Test those steps, or accept the unit with a concession first.`);
  }
  const overdue = await releaseBlockersFromInstruments(actor, unitId);
  if (overdue.length > 0) throw new HttpError(422, overdue.join(" "));
  return gathered;
}

/** Revision 1 under the lab's next number. 409 when the unit already has a report (replace it instead). */
export async function releaseReport(actor: Actor, input: z.output<typeof releaseInputSchema>, address: string): Promise<Report> {
  requireReleaser(actor, "release");
  const gathered = await releasable(actor, input.unitId);
  if ((await listUnitReports(actor.scope, input.unitId)).length > 0) throw new HttpError(409, "This unit already has a released report: issue a new revision instead.");
  const signature = await signWithPassword(actor, { password: input.password, purpose: "release", subjectKind: "unit", subjectId: input.unitId, address });
  const row = await insertFirstRevision(actor.scope.labId, input.unitId, (n) => renderAndStore(actor.scope.labId, gathered, n, signature, ""));
  if (row === "missing") throw new HttpError(404, "No such unit.");
  if (row === "exists") throw new HttpError(409, "This unit already has a released report: issue a new revision instead.");
  // The client users are told; a mail failure never undoes the release (notifyReportEvent never throws).
  await notifyReportEvent(row.id, "released");
  return row;
}

/** A new revision under the same number, replacing the latest; the reason is printed on the new revision. */
export async function supersedeReport(actor: Actor, input: z.output<typeof supersedeInputSchema>, address: string): Promise<Report> {
  requireReleaser(actor, "supersede");
  const gathered = await releasable(actor, input.unitId);
  const latest = (await listUnitReports(actor.scope, input.unitId))[0];
  if (!latest) throw new HttpError(409, "This unit has no released report to replace: release one first.");
  const signature = await signWithPassword(actor, { password: input.password, purpose: "supersede", subjectKind: "report", subjectId: latest.id, address });
  const row = await insertNextRevision(actor.scope.labId, input.unitId, (n) => renderAndStore(actor.scope.labId, gathered, n, signature, input.reason));
  if (row === "missing") throw new HttpError(404, "No such unit.");
  if (row === "none") throw new HttpError(409, "This unit has no released report to replace: release one first.");
  // The client users are told; a mail failure never undoes the release (notifyReportEvent never throws).
  // The mail names the revision that is no longer valid (the new one is in its link).
  await notifyReportEvent(latest.id, "superseded");
  return row;
}

/** Withdraws the valid revision: the verification page then says withdrawn. */
export async function withdrawReport(actor: Actor, input: z.output<typeof withdrawInputSchema>, address: string): Promise<Report> {
  requireReleaser(actor, "withdraw");
  const latest = (await listUnitReports(actor.scope, input.unitId))[0];
  if (!latest) throw new HttpError(404, "No released report for this unit.");
  if (latest.status !== "valid") throw new HttpError(409, "The latest revision is not valid: there is nothing to withdraw.");
  await signWithPassword(actor, { password: input.password, purpose: "withdraw", subjectKind: "report", subjectId: latest.id, address });
  const row = await withdrawLatest(actor.scope.labId, input.unitId, { userId: actor.userId, reason: input.reason });
  if (row === "missing") throw new HttpError(404, "No such unit.");
  if (row === "none") throw new HttpError(409, "The latest revision is not valid: there is nothing to withdraw.");
  // The client users are told; a mail failure never undoes the release (notifyReportEvent never throws).
  await notifyReportEvent(row.id, "withdrawn");
  return row;
}
