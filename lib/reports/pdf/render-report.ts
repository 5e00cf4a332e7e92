import type { ReportContent } from "@/lib/reports/content";
import { formatFigureParts, quantityFor } from "@/lib/verdicts/format-figure";
import { VERDICT_WORDS } from "@/lib/verdicts/words";
import { CONTENT_WIDTH, INK, MUTED, PAGE, createReportDocument, heading, paragraph, writeFrame } from "./document";
import { drawStepPlots, type PlotData } from "./plots";
import { drawQrCode } from "./qr";
import { drawPairs, drawTable, type Column } from "./table";

// A test report drawn from its stored content and the plot data of its captures of record. Released
// reports carry the verification address and its QR code; drafts carry DRAFT on every page instead.

export type RenderOptions = {
  /** The public verification address of this number; null for a draft. */
  verifyUrl: string | null;
  draft: boolean;
  /** Plot data per plan step id. */
  plots: ReadonlyMap<string, PlotData>;
  footer?: string;
};

export const SAFETY_NOTE =
  "Safety and advisory note: the captures were taken from energised terminals of a rotating machine with rated differential " +
  "probes or isolated inputs, by qualified people under local electrical codes and the site's lock-out rules. The verdicts are " +
  "advisory measurements against the tolerance bands of the unit's rating; release of the unit is a person's decision under licensed practice.";
export const ITEM_STATEMENT = "The results relate only to the item tested.";

const when = (iso: string) => `${iso.slice(0, 16).replace("T", " ")} UTC`;
const num = (n: number | null) => (n === null || !Number.isFinite(n) ? "—" : String(Number(n.toPrecision(5))));

const CHECK_COLUMNS: Column[] = [
  { header: "Check", width: 150 }, { header: "Measured", width: 70, align: "right" }, { header: "Unit", width: 45 },
  { header: "Limit", width: 125 }, { header: "Verdict", width: 60 }, { header: "U (k = 2)", width: CONTENT_WIDTH - 450 },
];

function titleBlock(doc: PDFKit.PDFDocument, content: ReportContent, options: RenderOptions): void {
  const top = doc.y;
  const qr = 92;
  const textWidth = CONTENT_WIDTH - (options.verifyUrl ? qr + 12 : 0);
  doc.font("bold").fontSize(20).fillColor(INK).text(options.draft ? "Test report (DRAFT)" : "Test report", PAGE.left, top, { width: textWidth });
  doc.font("bold").fontSize(10).text(content.lab.name, { width: textWidth });
  doc.font("regular").fontSize(9).fillColor(MUTED).text(content.lab.address || "Address not recorded", { width: textWidth });
  if (options.footer) doc.text(options.footer, { width: textWidth });
  if (options.verifyUrl) {
    drawQrCode(doc, options.verifyUrl, PAGE.left + CONTENT_WIDTH - qr, top, qr);
    doc.font("regular").fontSize(6.5).fillColor(MUTED).text(options.verifyUrl, PAGE.left + CONTENT_WIDTH - qr - 30, top + qr + 2, { width: qr + 30, align: "center" });
  }
  doc.x = PAGE.left;
  doc.y = Math.max(doc.y, top + (options.verifyUrl ? qr + 22 : 0));
  doc.fillColor(INK);
}

function identification(doc: PDFKit.PDFDocument, content: ReportContent, draft: boolean): void {
  const captured = content.steps.flatMap((s) => (s.capture ? [s.capture.capturedAt] : [])).sort();
  const range = captured.length === 0 ? "no capture of record" : `${when(captured[0] as string)} to ${when(captured[captured.length - 1] as string)}`;
  drawPairs(doc, [
    { label: "Report number", value: draft ? `${content.number} (draft, no number yet)` : content.number },
    { label: "Revision", value: String(content.revision) + (content.supersedes ? ` (replaces revision ${content.supersedes.revision}: ${content.supersedes.reason})` : "") },
    { label: "Date of issue", value: when(content.issuedAt) },
    { label: "Dates of testing (captures)", value: range },
    { label: "Client", value: `${content.client.name}\n${content.client.address || "Address not recorded"}` },
    { label: "Item tested", value: `Serial ${content.unit.serial} · model ${content.unit.modelCode} · ${content.unit.ratingName}` },
    { label: "Overall against the plan", value: content.overall ? VERDICT_WORDS[content.overall] : "—" },
    { label: "Disposition", value: content.disposition },
  ]);
}

function stepSection(doc: PDFKit.PDFDocument, content: ReportContent, index: number, options: RenderOptions): void {
  const step = content.steps[index];
  if (!step) return;
  heading(doc, `Step ${index + 1}: ${step.name} · ${step.testKind}`, 11);
  const c = step.capture;
  if (!c) {
    paragraph(doc, "Not tested: this step has no capture of record.", { color: MUTED });
    return;
  }
  drawPairs(doc, [
    { label: "Capture of record", value: `${c.fileName} · sha256 ${c.sha256}` },
    { label: "Captured", value: when(c.capturedAt) },
    { label: "Conditions", value: `Speed ${c.speedRpm === null ? "not given" : `${num(c.speedRpm)} rpm`} · magnet temperature ${c.magnetTemperatureC === null ? "not given" : `${num(c.magnetTemperatureC)} °C`}` },
    { label: "Result of the capture", value: `${c.overall ? VERDICT_WORDS[c.overall] : "—"} · analysis engine ${c.analysisVersion}` },
  ]);
  drawTable(doc, CHECK_COLUMNS, step.checks.map((k) => {
    // Rounded as the uncertainty allows (GUM 7.2.6), else to the quantity's resolution, as on the pages.
    const parts = formatFigureParts(k.value, { quantity: quantityFor(k.unit, k.checkId), uncertainty: k.expandedUncertainty });
    const u = parts?.uncertainty ?? null;
    return [k.label, parts?.value ?? "—", k.unit, k.limit, VERDICT_WORDS[k.verdict], u === null ? (k.expandedUncertainty === null ? "not evaluated" : `± ${num(k.expandedUncertainty)} ${k.unit}`) : `± ${u} ${k.unit}`];
  }));
  for (const note of step.notes) paragraph(doc, `Capture quality: ${note}`, { size: 8, color: MUTED });
  drawStepPlots(doc, options.plots.get(step.stepId) ?? { preview: null, spectrum: null });
}

function listSection(doc: PDFKit.PDFDocument, title: string, items: readonly string[], empty: string): void {
  heading(doc, title, 11);
  if (items.length === 0) paragraph(doc, empty, { color: MUTED });
  for (const item of items) paragraph(doc, `• ${item}`);
}

export async function renderReportPdf(content: ReportContent, options: RenderOptions): Promise<{ bytes: Buffer; pageCount: number }> {
  const { doc, done } = createReportDocument(`Test report ${content.number} revision ${content.revision}`);
  titleBlock(doc, content, options);
  identification(doc, content, options.draft);
  heading(doc, "Item description: rating", 11);
  drawPairs(doc, content.unit.nameplate);
  listSection(doc, "Methods", content.methods, "No method recorded.");
  heading(doc, "Decision rule", 11);
  paragraph(doc, content.decisionRule);
  paragraph(doc, content.uncertaintyStatement);
  heading(doc, "Results per plan step", 12);
  content.steps.forEach((_, i) => stepSection(doc, content, i, options));
  if (content.steps.length === 0) paragraph(doc, "The rating has no test plan steps.", { color: MUTED });
  heading(doc, "Unit-level results", 11);
  if (content.unitResults.length === 0) paragraph(doc, "None for this rating (no figure is judged across captures).", { color: MUTED });
  else drawPairs(doc, content.unitResults, 200);
  heading(doc, "Instruments used", 11);
  if (content.instruments.length === 0) paragraph(doc, "Instruments: not recorded.", { color: MUTED });
  else drawTable(doc, [{ header: "Kind", width: 90 }, { header: "Instrument", width: 230 }, { header: "Serial", width: 90 }, { header: "Calibration due", width: CONTENT_WIDTH - 410 }],
    content.instruments.map((i) => [i.kind, i.description, i.serial, i.calibrationDue ?? "not recorded"]));
  listSection(doc, "Deviations, concessions and confirmations", content.deviations, "None: every plan step was tested as the method describes.");
  if (content.clientNotes.length > 0) listSection(doc, "Notes for the client", content.clientNotes, "");
  heading(doc, "Authorisation", 11);
  const a = content.authorisedBy;
  paragraph(doc, options.draft ? "Not authorised: this is a draft." : `Authorised by ${a.name}, ${a.role}, on ${when(a.signedAt)}: ${a.meaning}.`);
  paragraph(doc, ITEM_STATEMENT, { bold: true });
  paragraph(doc, SAFETY_NOTE, { size: 8, color: MUTED });
  paragraph(doc, "End of report.", { size: 8, color: MUTED });
  const pageCount = writeFrame(doc, { lab: content.lab.name, number: content.number, revision: content.revision, verifyUrl: options.verifyUrl, draft: options.draft });
  doc.end();
  return { bytes: await done, pageCount };
}
