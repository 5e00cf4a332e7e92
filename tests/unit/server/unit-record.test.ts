import { describe, expect, it } from "vitest";
import type { UnitRecord } from "@/lib/dal/unit-report";
import { renderUnitCsv } from "@/lib/server/reports/unit-csv";

const verdict = (check: string, label: string, measured: number | string | null, status: "pass" | "marginal" | "fail" | "not-applicable") => ({
  check, label, measured, unit: "%", lower: null, upper: 5, status, basis: "line-line", source: "test",
});

function record(): UnitRecord {
  const report = {
    analysisVersion: "t", sampleRateHz: 50_000, sampleCount: 10_000, durationS: 0.2, cyclesAnalysed: 10, harmonicCycles: 10, frequencyHz: 50,
    frequencyZeroCrossingHz: 50, referenceChannel: "V_AB", channels: [], threePhase: null, backEmf: null, power: null,
    warnings: [{ code: "few-cycles", message: "Only ten cycles." }],
    verdicts: [verdict("thd", "THD, worst line", 2.5, "pass"), verdict("note", '=HYPERLINK("x"), "quoted"', "=1+1", "fail")],
    overall: "fail" as const,
  };
  return {
    serial: "KG45-260301", modelCode: "KG-45T", ratingTitle: "45 kVA", owner: "Kestrum Generators", disposition: "open",
    nameplate: { frequencyHz: 50 }, generatedAt: new Date("2026-12-01T10:00:00Z"),
    captures: [{ captureId: "c1", createdAt: new Date("2026-11-30T09:00:00Z"), testKind: "no-load", speedRpm: 1500, originalName: "a.csv", sha256: "ab".repeat(32), station: "Bay 1", analysisVersion: "t", report }],
  };
}

describe("renderUnitCsv(record)", () => {
  it("writes one RFC 4180 row per verdict and defuses spreadsheet formulas", () => {
    const lines = renderUnitCsv(record()).trimEnd().split("\r\n");
    expect(lines).toHaveLength(3);
    expect(lines[0]).toMatch(/^serial,model,capture_id,/);
    expect(lines[1]).toContain("KG45-260301,KG-45T,c1,2026-11-30T09:00:00.000Z,no-load,1500,t,thd,\"THD, worst line\",2.5,%,,5,pass,line-line,Within");
    expect(lines[2]).toContain(`"'=HYPERLINK(""x""), ""quoted""",'=1+1,`);
  });
});
