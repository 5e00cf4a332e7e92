import "server-only";
import { getClientReports, getValidReportForLabUnit, listClientReports, type PortalListRow, type PortalReportRow } from "@/db/queries/portal";
import { HttpError, requireApiUser, requireRole } from "@/lib/auth/guards";
import { portalFilterDates, type PortalQuery } from "@/lib/reports/portal-query";
import { csvResponse, pdfResponse, zipResponse } from "./portal-files";

// The client portal: a client's users read their own released reports. Another client's report, or a
// missing one, answers 404 alike.

export type PortalListItem = PortalListRow;

/** Released reports per page of the portal. */
export const PORTAL_PAGE_SIZE = 50;

export async function getPortalView(query: PortalQuery): Promise<{ reports: PortalListItem[]; organisationName: string; page: number; hasMore: boolean }> {
  const user = await requireRole("manufacturer");
  const page = query.page ?? 1;
  const rows = await listClientReports(user.organisationId, {
    serial: query.serial, model: query.model, ...portalFilterDates(query), limit: PORTAL_PAGE_SIZE + 1, offset: (page - 1) * PORTAL_PAGE_SIZE,
  });
  return { reports: rows.slice(0, PORTAL_PAGE_SIZE), organisationName: user.organisationName, page, hasMore: rows.length > PORTAL_PAGE_SIZE };
}

async function oneReport(clientId: string, id: string): Promise<PortalReportRow> {
  const row = (await getClientReports(clientId, [id]))[0];
  if (!row) throw new HttpError(404, "No such report.");
  return row;
}

export async function downloadPortalFile(id: string, kind: "pdf" | "csv"): Promise<Response> {
  const user = await requireApiUser("manufacturer");
  const row = await oneReport(user.organisationId, id);
  return kind === "pdf" ? pdfResponse(row) : csvResponse(row);
}

/** A selection as one zip; ids that are not the client's count as missing and refuse the whole request. */
export async function downloadPortalZip(ids: readonly string[]): Promise<Response> {
  const user = await requireApiUser("manufacturer");
  const unique = [...new Set(ids)];
  const rows = await getClientReports(user.organisationId, unique);
  if (rows.length !== unique.length) throw new HttpError(404, `${unique.length - rows.length} of the selected reports do not exist.`);
  return zipResponse(rows, `reports-${new Date().toISOString().slice(0, 10)}.zip`);
}

/** The per-unit CSV of a released unit (lab staff): drawn from its valid report; null when none is released. */
export async function releasedUnitCsv(unitId: string): Promise<Response | null> {
  const user = await requireApiUser();
  if (user.organisationKind !== "lab") return null;
  const row = await getValidReportForLabUnit(user.organisationId, unitId);
  return row ? csvResponse(row) : null;
}
