import QRCode from "qrcode";
import type { Doc } from "./document";

/** A QR code of `text` drawn as vector squares (one path, one fill), `size` points wide, quiet zone included. */
export function drawQrCode(doc: Doc, text: string, x: number, y: number, size: number): void {
  const { modules } = QRCode.create(text, { errorCorrectionLevel: "M" });
  const quiet = 4;
  const cell = size / (modules.size + 2 * quiet);
  doc.save();
  doc.rect(x, y, size, size).fill("#ffffff");
  for (let row = 0; row < modules.size; row++) {
    for (let col = 0; col < modules.size; col++) {
      if (modules.get(row, col)) doc.rect(x + (col + quiet) * cell, y + (row + quiet) * cell, cell, cell);
    }
  }
  doc.fill("#000000");
  doc.restore();
}
