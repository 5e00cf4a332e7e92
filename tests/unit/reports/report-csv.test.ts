import { describe, expect, it } from "vitest";
import { renderReportCsv, reportFileName, REPORT_CSV_COLUMNS } from "@/lib/reports/report-csv";
import { reportContent } from "@/tests/integration/report-fixtures-content";

describe("renderReportCsv(content, status)", () => {
  it("writes one row per check of each step, with number, revision and status on each", () => {
    const csv = renderReportCsv(reportContent("R-0001", 2, "SN-1"), "superseded");
    const lines = csv.trimEnd().split("\r\n");
    expect(lines[0]).toBe(REPORT_CSV_COLUMNS.join(","));
    expect(lines).toHaveLength(1 + 3);
    expect(lines[1]!.startsWith("R-0001,2,superseded,accepted,SN-1,KG45,No-load at 1500 rpm,no-load,noload.csv,")).toBe(true);
    // 8 significant digits (common practice in this project's CSVs): 2.345678912 -> 2.3456789
    expect(lines[1]).toContain(",thd,THD (line),,2.3456789,%,");
  });
  it("defuses a text cell that starts like a formula and quotes it per RFC 4180", () => {
    const csv = renderReportCsv(reportContent("R-0001", 1, "SN-1"), "valid");
    expect(csv).toContain(`"'=HYPERLINK(""x"")"`);
  });
  it("reportFileName marks a revision that is not valid", () => {
    expect(reportFileName({ number: "R-0001", revision: 1, serial: "SN/1", status: "withdrawn" }, "pdf")).toBe("R-0001-rev1-SN_1-WITHDRAWN.pdf");
    expect(reportFileName({ number: "R-0001", revision: 2, serial: "SN-1", status: "valid" }, "csv")).toBe("R-0001-rev2-SN-1.csv");
  });
});
