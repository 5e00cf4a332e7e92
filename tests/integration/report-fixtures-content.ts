import type { ReportContent } from "@/lib/reports/content";

// A released report's stored content for tests (invented unit, lab and figures).
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

