import path from "node:path";
import PDFDocument from "pdfkit";

// The page frame of every report PDF: A4, DejaVu (so "≤ ± ° Ω" print), room for the running head and
// foot that are written on every page once the page count is known.

const FONT_DIR = path.join(process.cwd(), "node_modules", "dejavu-fonts-ttf", "ttf");

export const INK = "#141c21";
export const MUTED = "#4a5a63";
export const RULE = "#c9d1d6";
export const PAGE = { width: 595.28, height: 841.89, left: 48, right: 48, top: 78, bottom: 64 } as const;
export const CONTENT_WIDTH = PAGE.width - PAGE.left - PAGE.right;
/** The lowest y body text may reach. */
export const BODY_BOTTOM = PAGE.height - PAGE.bottom;

export type Doc = PDFKit.PDFDocument;

export function createReportDocument(title: string): { doc: Doc; done: Promise<Buffer> } {
  const doc = new PDFDocument({
    size: "A4", bufferPages: true, autoFirstPage: true,
    margins: { top: PAGE.top, bottom: PAGE.bottom, left: PAGE.left, right: PAGE.right },
    info: { Title: title, Author: "Emfolio", Creator: "Emfolio" },
  });
  doc.registerFont("regular", path.join(FONT_DIR, "DejaVuSans.ttf"));
  doc.registerFont("bold", path.join(FONT_DIR, "DejaVuSans-Bold.ttf"));
  doc.font("regular");
  const chunks: Buffer[] = [];
  doc.on("data", (c: Buffer) => chunks.push(c));
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on("end", () => resolve(Buffer.concat(chunks)));
    doc.on("error", reject);
  });
  return { doc, done };
}

/** Starts a new page when `height` points would not fit above the foot; true when it did. */
export function ensureSpace(doc: Doc, height: number): boolean {
  if (doc.y + height <= BODY_BOTTOM) return false;
  doc.addPage();
  return true;
}

export function heading(doc: Doc, text: string, size = 12): void {
  ensureSpace(doc, size * 3.2);
  doc.moveDown(0.6);
  doc.font("bold").fontSize(size).fillColor(INK).text(text, PAGE.left, doc.y, { width: CONTENT_WIDTH });
  doc.moveDown(0.2);
  doc.font("regular").fontSize(9);
}

/** A paragraph that moves to the next page whole when it does not fit (short paragraphs are never split). */
export function paragraph(doc: Doc, text: string, options: { size?: number; color?: string; bold?: boolean } = {}): void {
  const size = options.size ?? 9;
  doc.font(options.bold ? "bold" : "regular").fontSize(size);
  const height = doc.heightOfString(text, { width: CONTENT_WIDTH });
  if (height < BODY_BOTTOM - PAGE.top) ensureSpace(doc, height);
  doc.fillColor(options.color ?? INK).text(text, PAGE.left, doc.y, { width: CONTENT_WIDTH });
  doc.font("regular");
}

export type Frame = { lab: string; number: string; revision: number; verifyUrl: string | null; draft: boolean };

/**
 * The running head and foot on every page (report number, revision, "page x of y") and, on a draft,
 * DRAFT across each page. Margins are lifted while writing so the text outside the body makes no new page.
 */
export function writeFrame(doc: Doc, frame: Frame): number {
  const range = doc.bufferedPageRange();
  const total = range.count;
  for (let i = range.start; i < range.start + total; i++) {
    doc.switchToPage(i);
    const saved = { ...doc.page.margins };
    doc.page.margins = { top: 0, bottom: 0, left: 0, right: 0 };
    const id = frame.draft ? `DRAFT · not a released report · ${frame.number}` : `Report ${frame.number} · revision ${frame.revision}`;
    doc.font("bold").fontSize(8.5).fillColor(INK).text(`${frame.lab} · Test report`, PAGE.left, 30, { width: CONTENT_WIDTH / 2, lineBreak: false });
    doc.font("regular").fontSize(8.5).text(`${id} · Page ${i - range.start + 1} of ${total}`, PAGE.left + CONTENT_WIDTH / 2, 30, { width: CONTENT_WIDTH / 2, align: "right", lineBreak: false });
    doc.moveTo(PAGE.left, 46).lineTo(PAGE.width - PAGE.right, 46).lineWidth(0.5).strokeColor(RULE).stroke();
    const foot = frame.verifyUrl ? `Verify this report: ${frame.verifyUrl}` : "Draft for the lab's own use: not for the client.";
    doc.fontSize(7.5).fillColor(MUTED).text(`${foot} · Advisory measurements; the results relate only to the item tested.`, PAGE.left, PAGE.height - 42, { width: CONTENT_WIDTH, align: "center", lineBreak: false });
    if (frame.draft) stampDraft(doc);
    doc.page.margins = saved;
  }
  return total;
}

function stampDraft(doc: Doc): void {
  doc.save();
  doc.rotate(-35, { origin: [PAGE.width / 2, PAGE.height / 2] });
  doc.font("bold").fontSize(110).fillColor("#b0372b").fillOpacity(0.14)
    .text("DRAFT", 0, PAGE.height / 2 - 60, { width: PAGE.width, align: "center", lineBreak: false });
  doc.restore();
  doc.fillOpacity(1);
}
