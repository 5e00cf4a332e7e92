import { and, eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { reports, signatures, units, users, type ReportStatus } from "@/db/schema";
import { putReportPdf, reportObjectKey, sha256Hex } from "@/lib/server/report-store";
import { reportContent } from "./report-fixtures-content";

export { reportContent };

// Released report rows made by the tests themselves (the release flow is built elsewhere): a signature,
// a reports row with its content, and stored PDF bytes under a fresh key.

export async function firstUnitOf(labId: string, clientId: string): Promise<{ id: string; serial: string }> {
  const [u] = await getDb().select({ id: units.id, serial: units.serial }).from(units).where(and(eq(units.labId, labId), eq(units.organisationId, clientId))).limit(1);
  if (!u) throw new Error("the seeded lab has no unit of this client: run the seed");
  return u;
}

export async function insertReport(o: {
  labId: string; clientId: string; unit: { id: string; serial: string }; number: string; revision?: number; status?: ReportStatus;
  signerId: string; pdf?: Uint8Array; recordedSha?: string; sizeBytes?: number;
}) {
  const revision = o.revision ?? 1;
  const pdf = o.pdf ?? new TextEncoder().encode(`%PDF-1.4\n% test report ${o.number} rev ${revision}\n%%EOF\n`);
  const sha = sha256Hex(pdf);
  const key = reportObjectKey(o.labId, o.number, revision, sha);
  await putReportPdf(key, pdf, sha);
  const [signer] = await getDb().select().from(users).where(eq(users.id, o.signerId));
  const [sig] = await getDb().insert(signatures).values({
    labId: o.labId, signerId: o.signerId, signerName: signer?.name ?? "x", signerRole: "qa", purpose: "release", meaning: "reviewed and approved for release",
    subjectKind: "unit", subjectId: o.unit.id,
  }).returning();
  const [row] = await getDb().insert(reports).values({
    labId: o.labId, unitId: o.unit.id, clientId: o.clientId, number: o.number, revision, status: o.status ?? "valid", objectKey: key,
    sha256: o.recordedSha ?? sha, sizeBytes: o.sizeBytes ?? pdf.byteLength, pageCount: 1, disposition: "accepted", overall: "pass",
    content: reportContent(o.number, revision, o.unit.serial) as unknown as Record<string, unknown>, releasedById: o.signerId, signatureId: sig!.id,
  }).returning();
  return { row: row!, pdf };
}
