import { execFileSync } from "node:child_process";
import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { inflateSync } from "node:zlib";
import { describe, expect, it } from "vitest";
import QRCode from "qrcode";
import { limitWords } from "@/lib/reports/build-content";
import { reportContentSchema, type ReportContent } from "@/lib/reports/content";
import { decimate } from "@/lib/reports/pdf/plots";
import { renderReportPdf } from "@/lib/reports/pdf/render-report";

// The report drawing on its own: long tables over several pages, the running head, DRAFT, the QR code.

function content(checks: number): ReportContent {
  return reportContentSchema.parse({
    version: 1, number: "TL-000042", revision: 3, issuedAt: "2026-12-02T10:00:00.000Z",
    lab: { name: "Test Lab", address: "1 Bench Row" }, client: { name: "Client Co", address: "2 Quay" },
    unit: { serial: "SN-1", modelCode: "M-1", ratingName: "Rating", nameplate: [{ label: "Rated voltage", value: "400 V" }] },
    disposition: "accepted", overall: "pass",
    steps: [{
      stepId: "s1", name: "Long step", testKind: "No-load (open circuit)",
      capture: { id: "c1", fileName: "a.csv", sha256: "ab".repeat(32), capturedAt: "2026-12-01T09:00:00.000Z", speedRpm: 1500, magnetTemperatureC: 21.5, analysisVersion: "3.1.0", overall: "pass" },
      checks: Array.from({ length: checks }, (_, i) => ({
        checkId: `row-${i}`, label: `Row ${i} with a label long enough to wrap onto a second line, ending tail${i}x`, order: null, value: i + 0.5, unit: "Ω",
        limit: "≤ 5 %", lower: null, upper: 5, verdict: "pass", expandedUncertainty: i % 2 ? 0.02 : null, source: "test",
      })),
      notes: [],
    }],
    unitResults: [], methods: ["IEC 60034-1"], decisionRule: "Simple acceptance.", uncertaintyStatement: "Measurement uncertainty: not evaluated.",
    instruments: [], deviations: [], concession: null, clientNotes: [],
    authorisedBy: { name: "A Person", role: "Quality engineer", signedAt: "2026-12-02T10:00:00.000Z", meaning: "reviewed and approved for release" },
    supersedes: { revision: 2, reason: "typo" },
  });
}

function pages(bytes: Buffer, count: number): string[] {
  const file = path.join(mkdtempSync(path.join(tmpdir(), "emfolio-render-")), "r.pdf");
  writeFileSync(file, bytes);
  return Array.from({ length: count }, (_, i) => execFileSync("/usr/bin/pdftotext", ["-f", String(i + 1), "-l", String(i + 1), "-layout", file, "-"]).toString().replace(/\s+/g, " "));
}

describe("renderReportPdf(content, options)", () => {
  it("renderReportPdf repeats the results header on every page a long table runs onto and cuts no row", async () => {
    const { bytes, pageCount } = await renderReportPdf(content(120), { verifyUrl: "http://127.0.0.1/verify/TL-000042", draft: false, plots: new Map() });
    expect(pageCount).toBeGreaterThan(3);
    const texts = pages(bytes, pageCount);
    const withRows = texts.filter((t) => /Row \d+ with a label/.test(t));
    expect(withRows.length).toBeGreaterThan(2);
    for (const t of withRows) expect(t).toContain("Check Measured Unit Limit Verdict");
    // Every row's label and both of its wrapped halves land on the same page.
    for (let i = 0; i < 120; i++) {
      const holder = texts.filter((t) => t.includes(`Row ${i} with a label`));
      expect(holder, `row ${i}`).toHaveLength(1);
      expect(holder[0], `row ${i}`).toContain(`tail${i}x`);
    }
    texts.forEach((t, i) => expect(t).toContain(`Report TL-000042 · revision 3 · Page ${i + 1} of ${pageCount}`));
    // pdftotext -layout drops the narrow spaces of "≤ 5 %".
    expect(texts.join(" ")).toMatch(/≤ ?5 ?%/);
    expect(texts.join(" ")).toContain("21.5 °C");
    expect(texts.join(" ")).toContain("± 0.020 Ω");
  }, 30_000);

  it("renderReportPdf marks a draft DRAFT on every page and leaves out the verification address", async () => {
    const { bytes, pageCount } = await renderReportPdf(content(60), { verifyUrl: null, draft: true, plots: new Map() });
    const texts = pages(bytes, pageCount);
    expect(pageCount).toBeGreaterThan(1);
    for (const t of texts) expect(t).toMatch(/DRAFT.*Page \d+ of \d+/);
    expect(texts.join(" ")).not.toContain("/verify/");
  }, 30_000);

  it("renderReportPdf draws the QR code as vector squares, one per dark module of the qrcode package's matrix", async () => {
    const url = "http://127.0.0.1/verify/TL-000042";
    const { bytes } = await renderReportPdf(content(1), { verifyUrl: url, draft: false, plots: new Map() });
    const { modules } = QRCode.create(url, { errorCorrectionLevel: "M" });
    const dark = Array.from(modules.data).filter(Boolean).length;
    // pdfkit deflates page streams: inflate each and count the rectangle operators.
    const raw = bytes.toString("latin1");
    const streams = [...raw.matchAll(/stream\r?\n([\s\S]*?)endstream/g)].map((m) => {
      try { return inflateSync(Buffer.from(m[1] ?? "", "latin1")).toString("latin1"); } catch { return ""; }
    });
    const rects = streams.map((s) => (s.match(/ re\b/g) ?? []).length);
    expect(Math.max(...rects)).toBeGreaterThanOrEqual(dark);
  }, 30_000);
});

describe("decimate(values, reduce) and the plots", () => {
  it("decimate keeps each bucket's extreme of a 2000-point envelope in 600 points", () => {
    const values = Array.from({ length: 2000 }, (_, i) => Math.sin(i / 50));
    const high = decimate(values, (a, b) => Math.max(a, b));
    const low = decimate(values, (a, b) => Math.min(a, b));
    expect(high).toHaveLength(600);
    expect(high.every(Number.isFinite)).toBe(true);
    expect(Math.max(...high)).toBe(Math.max(...values));
    expect(Math.min(...low)).toBe(Math.min(...values));
  });

  it("renderReportPdf draws a stored 2000-point preview and its spectrum for a step", async () => {
    const n = 2000;
    const timeS = Array.from({ length: n }, (_, i) => i / 10_000);
    const wave = (k: number) => timeS.map((t) => 325 * Math.sin(2 * Math.PI * 50 * t - (k * 2 * Math.PI) / 3));
    const preview = { timeS, channels: [0, 1, 2].map((k) => ({ id: `V${k}`, min: wave(k), max: wave(k) })) };
    const spectrum = { frequencyHz: 50, channels: [{ id: "V0", unit: "V", orders: [1, 3, 5, 7], rms: [230, 1, 2, 0.5] }] };
    const { bytes } = await renderReportPdf(content(2), { verifyUrl: null, draft: true, plots: new Map([["s1", { preview, spectrum }]]) });
    const text = pages(bytes, 1).join(" ");
    expect(text).toContain("Waveform (min/max envelope)");
    expect(text).not.toContain("No stored waveform");
    expect(text).not.toContain("No stored spectrum");
  }, 30_000);
});

describe("limitWords(lower, upper, unit, status)", () => {
  it.each([
    [380, 420, "V", "pass", "380 – 420 V"], [null, 5, "%", "pass", "≤ 5 %"], [0.9, null, "", "pass", "≥ 0.9"], [null, null, "%", "pass", "—"],
  ] as const)("limitWords(%j, %j, %j, %j) is %j", (lower, upper, unit, status, words) => expect(limitWords(lower, upper, unit, status)).toBe(words));
  it("limitWords says not required with the reason", () => expect(limitWords(null, 5, "%", "not-required", "single phase")).toBe("not required: single phase"));
});
