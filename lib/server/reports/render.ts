import "server-only";
import type { Numbering, ReleasedFields } from "@/db/queries/reports";
import type { Signature } from "@/db/schema";
import { buildReportContent } from "@/lib/reports/build-content";
import type { ReportContent } from "@/lib/reports/content";
import { renderReportPdf } from "@/lib/reports/pdf/render-report";
import { getEnv } from "@/lib/server/env";
import { putReportPdf, reportObjectKey, sha256Hex } from "@/lib/server/report-store";
import type { Gathered } from "./gather";

/** The public address a released report's QR code and foot point at. */
export function verifyUrl(number: string): string {
  return `${getEnv().NEXTAUTH_URL.replace(/\/+$/, "")}/verify/${encodeURIComponent(number)}`;
}

/**
 * Builds the content under its number, renders the PDF once, stores it under its immutable key and
 * returns the row's fields. Runs inside the release transaction: a failure here gives the number back.
 */
export async function renderAndStore(
  labId: string, gathered: Gathered, numbering: Numbering, signature: Signature, reason: string,
): Promise<ReleasedFields> {
  const content = buildReportContent({
    ...gathered.base, number: numbering.number, revision: numbering.revision, issuedAt: signature.signedAt,
    authorisedBy: { name: signature.signerName, role: signature.signerRole, signedAt: signature.signedAt, meaning: signature.meaning },
    supersedes: numbering.previous ? { revision: numbering.previous.revision, reason } : null,
  });
  const { bytes, pageCount } = await renderReportPdf(content, { verifyUrl: verifyUrl(numbering.number), draft: false, plots: gathered.plots, footer: gathered.footer });
  const sha256 = sha256Hex(bytes);
  const objectKey = reportObjectKey(labId, numbering.number, numbering.revision, sha256);
  await putReportPdf(objectKey, bytes, sha256);
  return {
    objectKey, sha256, sizeBytes: bytes.byteLength, pageCount, disposition: gathered.base.unit.disposition as ReleasedFields["disposition"],
    overall: content.overall, content: content as unknown as Record<string, unknown>, releasedById: signature.signerId, signatureId: signature.id, reason,
  };
}

/** The lab's draft of a unit's report: the same content and drawing, DRAFT on every page, no number and no QR code. */
export async function renderDraft(gathered: Gathered, at: Date): Promise<{ bytes: Buffer; content: ReportContent }> {
  const content = buildReportContent({
    ...gathered.base, number: "DRAFT", revision: 1, issuedAt: at,
    authorisedBy: { name: "not authorised", role: "—", signedAt: at, meaning: "draft" }, supersedes: null,
  });
  const { bytes } = await renderReportPdf(content, { verifyUrl: null, draft: true, plots: gathered.plots, footer: gathered.footer });
  return { bytes, content };
}
