import { and, eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { reports, signatures, units, users, type ReportStatus } from "@/db/schema";
import type { ReportContent } from "@/lib/reports/content";
import { putReportPdf, reportObjectKey, sha256Hex } from "@/lib/server/report-store";

// Released report rows made by the tests themselves (the release flow is built elsewhere): a signature,
// a reports row with its content, and stored PDF bytes under a fresh key.

export function reportContent(number: string, revision: number, serial: string): ReportContent {
  const check = (checkId: string, label: string, value: number | null, verdict: "pass" | "fail" | "inconclusive") => ({
    checkId, label, order: null, value, unit: "%", limit: "≤ 5.0 %", lower: null, upper: 5, verdict, expandedUncertainty: 0.12, source: "IEC 60034-1 cl. 9.11",
  });
  return {
    version: 1, number, revision, issuedAt: "2026-03-02T10:00:00Z",
    lab: { name: "Harrowgate Test Lab", address: "1 Bench Row" }, client: { name: "Kestrum Generators", address: "12 Brindle Quay" },
    unit: { serial, modelCode: "KG45", ratingName: "KG45 test rating", nameplate: [{ label: "Rated voltage", value: "400 V" }] },
    disposition: "accepted", overall: "pass",
    steps: [
      { stepId: "s1", name: "No-load at 1500 rpm", testKind: "no-load",
        capture: { id: "c1", fileName: "noload.csv", sha256: "ab".repeat(32), capturedAt: "2026-03-01T09:00:00Z", speedRpm: 1500, magnetTemperatureC: null, analysisVersion: "2.1.0", overall: "pass" },
        checks: [check("thd", "THD (line)", 2.345678912, "pass"), check("unbalance", "=HYPERLINK(\"x\")", 0.4, "pass")], notes: [] },
      { stepId: "s2", name: "Back-EMF", testKind: "back-emf", capture: null, checks: [check("ke", "Ke", null, "inconclusive")], notes: ["No capture"] },
    ],
    unitResults: [], methods: ["IEC 60034-1"], decisionRule: "simple acceptance", uncertaintyStatement: "k = 2", instruments: [], deviations: [],
    concession: null, clientNotes: [],
    authorisedBy: { name: "Ines Vardy", role: "Quality engineer", signedAt: "2026-03-02T10:00:00Z", meaning: "reviewed and approved for release" },
    supersedes: revision > 1 ? { revision: revision - 1, reason: "corrected nameplate" } : null,
  };
}

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
