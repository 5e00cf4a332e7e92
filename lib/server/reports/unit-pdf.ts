import { VERDICT_WORDS } from "@/lib/verdicts/words";
import path from "node:path";
import PDFDocument from "pdfkit";
import type { UnitRecord } from "@/lib/dal/unit-report";

// A TTF shipped in an npm package: PDF fonts cannot be subset from woff2, and nothing is fetched.
const FONT_DIR = path.join(process.cwd(), "node_modules", "dejavu-fonts-ttf", "ttf");
const REGULAR = path.join(FONT_DIR, "DejaVuSans.ttf");
const BOLD = path.join(FONT_DIR, "DejaVuSans-Bold.ttf");

const STATUS_WORD = VERDICT_WORDS;
const INK = "#141c21";
const MUTED = "#4a5a63";

function num(value: number | string | null | undefined, digits = 4): string {
  if (value === null || value === undefined) return "—";
  return typeof value === "number" ? String(Number(value.toPrecision(digits))) : value;
}

/** Renders the per-serial test record as a PDF. */
export function renderUnitPdf(record: UnitRecord): Promise<Buffer> {
  const doc = new PDFDocument({ size: "A4", margin: 48, info: { Title: `Test record ${record.serial}`, Author: "Emfolio" } });
  doc.registerFont("regular", REGULAR);
  doc.registerFont("bold", BOLD);
  const chunks: Buffer[] = [];
  doc.on("data", (c: Buffer) => chunks.push(c));
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on("end", () => resolve(Buffer.concat(chunks)));
    doc.on("error", reject);
  });

  doc.font("bold").fontSize(18).fillColor(INK).text(`Test record · ${record.serial}`);
  doc.font("regular").fontSize(10).fillColor(MUTED)
    .text(`${record.modelCode} · ${record.ratingTitle} · ${record.owner}`)
    .text(`Disposition: ${record.disposition} · generated ${record.generatedAt.toISOString().slice(0, 16).replace("T", " ")} UTC`);
  doc.moveDown(0.5);
  const plate = Object.entries(record.nameplate).map(([k, v]) => `${k} ${String(v)}`).join(" · ");
  doc.fillColor(INK).text(`Rating: ${plate}`);
  doc.moveDown(0.5);
  doc.fontSize(8.5).fillColor(MUTED).text(
    "Advisory measurements. Captures were taken from energised terminals of a rotating machine; the verdicts below compare " +
      "measured figures with the tolerance bands of the unit's rating and do not by themselves release the unit. Release is a " +
      "qualified person's decision under local codes and licensed practice.",
  );

  if (record.captures.length === 0) {
    doc.moveDown().fontSize(11).fillColor(INK).text("No analysed capture yet.");
  }
  for (const c of record.captures) {
    doc.moveDown(1);
    if (doc.y > 680) doc.addPage();
    const r = c.report;
    doc.font("bold").fontSize(12).fillColor(INK)
      .text(`${c.testKind} · ${c.createdAt.toISOString().slice(0, 16).replace("T", " ")} UTC · overall ${STATUS_WORD[r.overall]}`);
    doc.font("regular").fontSize(8.5).fillColor(MUTED).text(
      `${c.originalName} · sha256 ${c.sha256.slice(0, 16)}… · ${c.station ?? "bench API"} · speed ${num(c.speedRpm)} rpm · ` +
        `${num(r.frequencyHz, 6)} Hz · ${r.cyclesAnalysed} cycles at ${num(r.sampleRateHz, 5)} S/s · analysis ${c.analysisVersion}`,
    );
    doc.moveDown(0.3);
    const channelLine = r.channels.map((ch) => `${ch.id} (${ch.role}) ${num(ch.rms)} ${ch.unit} rms, THD ${num(ch.thdFPercent, 3)} %`).join("; ");
    doc.fontSize(9).fillColor(INK).text(channelLine);
    doc.moveDown(0.3);
    drawVerdicts(doc, r.verdicts);
    for (const w of r.warnings) doc.fontSize(8.5).fillColor(MUTED).text(`Capture note: ${w.message}`);
  }
  doc.end();
  return done;
}

function drawVerdicts(doc: PDFKit.PDFDocument, verdicts: UnitRecord["captures"][number]["report"]["verdicts"]) {
  const x = doc.page.margins.left;
  const widths = [190, 80, 110, 80];
  const row = (cells: string[], bold = false) => {
    if (doc.y > 760) doc.addPage();
    const y = doc.y;
    doc.font(bold ? "bold" : "regular").fontSize(8.5).fillColor(INK);
    let cx = x;
    cells.forEach((text, i) => {
      doc.text(text, cx, y, { width: (widths[i] ?? 80) - 6 });
      cx += widths[i] ?? 80;
    });
    doc.x = x;
    doc.y = Math.max(doc.y, y + 12);
  };
  row(["Check", "Measured", "Band", "Verdict"], true);
  for (const v of verdicts) {
    const band = v.lower === null && v.upper === null ? "—" : `${num(v.lower)} … ${num(v.upper)} ${v.unit}`;
    row([v.label, `${num(v.measured)} ${v.unit}`, band, STATUS_WORD[v.status]]);
  }
}
