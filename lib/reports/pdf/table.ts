import { BODY_BOTTOM, CONTENT_WIDTH, INK, PAGE, RULE, ensureSpace, type Doc } from "./document";

export type Column = { header: string; width: number; align?: "left" | "right" };

const PAD = 3;
const SIZE = 8;

function rowHeight(doc: Doc, cells: readonly string[], columns: readonly Column[], bold: boolean): number {
  doc.font(bold ? "bold" : "regular").fontSize(SIZE);
  return Math.max(...cells.map((text, i) => doc.heightOfString(text || " ", { width: (columns[i]?.width ?? 60) - 2 * PAD }))) + 2 * PAD;
}

function drawRow(doc: Doc, cells: readonly string[], columns: readonly Column[], bold: boolean): void {
  const height = rowHeight(doc, cells, columns, bold);
  const top = doc.y;
  let x = PAGE.left;
  doc.font(bold ? "bold" : "regular").fontSize(SIZE).fillColor(INK);
  cells.forEach((text, i) => {
    const col = columns[i];
    if (!col) return;
    doc.text(text, x + PAD, top + PAD, { width: col.width - 2 * PAD, align: col.align ?? "left" });
    x += col.width;
  });
  doc.moveTo(PAGE.left, top + height).lineTo(PAGE.left + CONTENT_WIDTH, top + height).lineWidth(0.4).strokeColor(RULE).stroke();
  doc.x = PAGE.left;
  doc.y = top + height;
}

/**
 * A table whose header row is repeated at the top of every page it runs onto; a row that would cross
 * the page foot moves to the next page whole, so nothing is cut at a page edge.
 */
export function drawTable(doc: Doc, columns: readonly Column[], rows: readonly (readonly string[])[]): void {
  const headers = columns.map((c) => c.header);
  const headerHeight = rowHeight(doc, headers, columns, true);
  const first = rows[0];
  ensureSpace(doc, headerHeight + (first ? rowHeight(doc, first, columns, false) : 0));
  drawRow(doc, headers, columns, true);
  for (const row of rows) {
    const height = rowHeight(doc, row, columns, false);
    if (doc.y + height > BODY_BOTTOM) {
      doc.addPage();
      drawRow(doc, headers, columns, true);
    }
    drawRow(doc, row, columns, false);
  }
  doc.moveDown(0.4);
}

/** Label / value rows as a two-column table without a header row. */
export function drawPairs(doc: Doc, pairs: readonly { label: string; value: string }[], labelWidth = 150): void {
  const columns: Column[] = [{ header: "", width: labelWidth }, { header: "", width: CONTENT_WIDTH - labelWidth }];
  for (const p of pairs) {
    const height = rowHeight(doc, [p.label, p.value], columns, false);
    ensureSpace(doc, height);
    const top = doc.y;
    doc.font("bold").fontSize(SIZE).fillColor(INK).text(p.label, PAGE.left + PAD, top + PAD, { width: labelWidth - 2 * PAD });
    doc.font("regular").text(p.value, PAGE.left + labelWidth + PAD, top + PAD, { width: CONTENT_WIDTH - labelWidth - 2 * PAD });
    doc.x = PAGE.left;
    doc.y = top + height;
  }
  doc.moveDown(0.3);
}
