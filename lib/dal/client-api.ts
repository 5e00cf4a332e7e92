import "server-only";
import { z } from "zod";
import { getClientReportByNumber, listClientReportsBySerial, type PortalReportRow } from "@/db/queries/portal";
import { HttpError } from "@/lib/auth/guards";
import { requireClientToken } from "./client-tokens";
import { csvResponse, pdfResponse } from "./portal-files";
import { parseInput } from "./request";

// The client API (/api/v1/reports): released reports and their status, read with a personal token.

export const reportSerialQuerySchema = z.object({
  serial: z.string({ error: "serial: give the unit's serial, e.g. ?serial=KG-2026-0001." }).trim().min(1, "serial: give the unit's serial.").max(80, "serial: at most 80 characters."),
});

export const reportRevisionQuerySchema = z.object({
  revision: z.coerce.number({ error: "revision: a whole number." }).int("revision: a whole number.").positive("revision: 1 or more.").optional(),
});

function describe(r: PortalReportRow) {
  return {
    number: r.number, revision: r.revision, status: r.status, serial: r.serial, model: r.modelCode, disposition: r.disposition,
    overall: r.overall, releasedAt: r.releasedAt.toISOString(), withdrawnAt: r.withdrawnAt?.toISOString() ?? null,
    sha256: r.sha256, sizeBytes: r.sizeBytes, lab: r.labName,
    pdf: `/api/v1/reports/${encodeURIComponent(r.number)}/pdf?revision=${r.revision}`,
    csv: `/api/v1/reports/${encodeURIComponent(r.number)}/csv?revision=${r.revision}`,
  };
}

export async function apiReportsBySerial(request: Request): Promise<Response> {
  const caller = await requireClientToken(request);
  const q = parseInput(reportSerialQuerySchema, Object.fromEntries(new URL(request.url).searchParams));
  const rows = await listClientReportsBySerial(caller.organisationId, q.serial);
  return Response.json({ serial: q.serial, reports: rows.map(describe) }, { headers: { "cache-control": "private, no-store" } });
}

async function pick(request: Request, number: string): Promise<PortalReportRow> {
  const caller = await requireClientToken(request);
  const q = parseInput(reportRevisionQuerySchema, Object.fromEntries(new URL(request.url).searchParams));
  if (number.length > 80) throw new HttpError(404, "No such report.");
  const revisions = await getClientReportByNumber(caller.organisationId, number);
  // Without ?revision: the valid revision, else the newest (marked superseded or withdrawn).
  const row = q.revision !== undefined ? revisions.find((r) => r.revision === q.revision) : (revisions.find((r) => r.status === "valid") ?? revisions[0]);
  if (!row) throw new HttpError(404, "No such report.");
  return row;
}

export async function apiReportStatus(request: Request, number: string): Promise<Response> {
  const caller = await requireClientToken(request);
  const revisions = await getClientReportByNumber(caller.organisationId, number.slice(0, 80));
  if (revisions.length === 0) throw new HttpError(404, "No such report.");
  return Response.json({ number, revisions: revisions.map(describe) }, { headers: { "cache-control": "private, no-store" } });
}

export async function apiReportFile(request: Request, number: string, kind: "pdf" | "csv"): Promise<Response> {
  const row = await pick(request, number);
  return kind === "pdf" ? pdfResponse(row) : csvResponse(row);
}
