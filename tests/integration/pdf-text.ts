import { execFileSync } from "node:child_process";
import { mkdtempSync, readdirSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";

// Reading PDFs back with poppler (pdftotext, pdftoppm), as a person or another program would.

export function writeTemp(bytes: Uint8Array, name = "report.pdf"): string {
  const dir = mkdtempSync(path.join(tmpdir(), "emfolio-report-"));
  const file = path.join(dir, name);
  writeFileSync(file, bytes);
  return file;
}

/** The text of each page, whitespace collapsed. */
export function pageTexts(file: string, pages: number): string[] {
  return Array.from({ length: pages }, (_, i) =>
    execFileSync("/usr/bin/pdftotext", ["-f", String(i + 1), "-l", String(i + 1), "-layout", file, "-"]).toString().replace(/\s+/g, " "));
}

export function wholeText(file: string): string {
  return execFileSync("/usr/bin/pdftotext", [file, "-"]).toString().replace(/\s+/g, " ");
}

/** pdftoppm renders every page to PNG at low resolution; returns the number of images written. */
export function renderedPageCount(file: string): number {
  const dir = mkdtempSync(path.join(tmpdir(), "emfolio-pages-"));
  execFileSync("/usr/bin/pdftoppm", ["-r", "30", "-png", file, path.join(dir, "p")]);
  return readdirSync(dir).filter((f) => f.endsWith(".png")).length;
}

/** The page count poppler reads from the file. */
export function pdfPageCount(file: string): number {
  const info = execFileSync("/usr/bin/pdfinfo", [file]).toString();
  return Number(/Pages:\s+(\d+)/.exec(info)?.[1] ?? 0);
}
