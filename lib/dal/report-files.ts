import "server-only";
import { z } from "zod";
import { findReport, listUnitReports } from "@/db/queries/reports";
import { HttpError } from "@/lib/auth/guards";
import { listActivePlanSteps } from "@/db/queries/judgement";
import { gatherReportInputs, missingStepNames } from "@/lib/server/reports/gather";
import { renderDraft } from "@/lib/server/reports/render";
import { readReportPdf, sha256Hex } from "@/lib/server/report-store";
import { SIGNING_ROLES } from "@/lib/reports/signature-meanings";
import type { Actor } from "./actor";
import { unitInScope, unitPlanInScope } from "./request-reads";

// Reading reports: the stored bytes of a released revision (checked against the recorded sha256, never
// rendered again), the lab's draft, and the unit page's list of revisions.

const safeName = (s: string) => s.replace(/[^\w.-]+/g, "_");

/** A released revision's stored PDF for anyone whose scope holds the unit (lab staff; the unit's client). */
export async function readReleasedReport(actor: Actor, reportId: string): Promise<{ bytes: Uint8Array; fileName: string }> {
  if (!z.uuid().safeParse(reportId).success) throw new HttpError(404, "No such report.");
  const found = await findReport(actor.scope, reportId);
  if (!found) throw new HttpError(404, "No such report.");
  const bytes = await readReportPdf(found.report.objectKey);
  if (sha256Hex(bytes) !== found.report.sha256) {
    console.error(`report ${found.report.id}: stored bytes do not match the recorded sha256`);
    throw new HttpError(500, "The stored file of this report does not match its recorded checksum; it was not sent. Tell the lab.");
  }
  return { bytes, fileName: `${safeName(found.report.number)}-rev${found.report.revision}.pdf` };
}

/** The lab's draft of a unit's report. A client (or another lab) gets 404, as for a missing unit. */
export async function renderUnitDraft(actor: Actor, unitId: string): Promise<{ bytes: Buffer; fileName: string }> {
  if (actor.scope.kind !== "lab" || !z.uuid().safeParse(unitId).success) throw new HttpError(404, "No such unit.");
  const gathered = await gatherReportInputs(actor.scope.labId, unitId);
  if (!gathered) throw new HttpError(404, "No such unit.");
  const { bytes } = await renderDraft(gathered, new Date());
  return { bytes, fileName: `emfolio-${safeName(gathered.base.unit.serial)}-DRAFT.pdf` };
}

export type ReleasePanelView = {
  canSign: boolean;
  missingSteps: string[];
  disposition: string;
  revisions: { id: string; number: string; revision: number; status: string; releasedAt: string; sha256: string; reason: string; withdrawReason: string | null; pageCount: number }[];
};

/** What the unit page's release panel shows; null for clients (they read released reports in their portal). */
export async function getReleasePanelView(actor: Actor, unitId: string): Promise<ReleasePanelView | null> {
  if (actor.scope.kind !== "lab" || !z.uuid().safeParse(unitId).success) return null;
  const found = await unitInScope(actor.scope, unitId);
  if (!found) return null;
  const [plan, steps, rows] = await Promise.all([unitPlanInScope(actor.scope, unitId), listActivePlanSteps(found.unit.ratingId), listUnitReports(actor.scope, unitId)]);
  if (!plan) return null;
  const missingSteps = missingStepNames(plan, steps);
  return {
    canSign: actor.role !== "station" && SIGNING_ROLES.release.includes(actor.role),
    missingSteps,
    disposition: found.unit.disposition,
    revisions: rows.map((r) => ({
      id: r.id, number: r.number, revision: r.revision, status: r.status, releasedAt: r.releasedAt.toISOString(), sha256: r.sha256,
      reason: r.reason, withdrawReason: r.withdrawReason, pageCount: r.pageCount,
    })),
  };
}
