import { splitLine, withoutTrailingEmpties } from "./dialect";
import { CaptureRejection } from "./rejection";
import { quoteCell } from "./number-syntax";

const HEX = /^[+-]?0x[0-9a-f]+$/i;
const DELIMITERS = [",", ";", "\t"];

export function isHexCell(cell: string): boolean {
  return HEX.test(cell.trim());
}

export function hexRejection(cell: string, line: number, column: string): CaptureRejection {
  return new CaptureRejection("hex-value", `Hexadecimal value ${quoteCell(cell)}: only decimal numbers are read (export the samples as decimal values)`, { line, column });
}

function quoteCount(line: string): number {
  let count = 0;
  for (const char of line) if (char === '"') count++;
  return count;
}

/** A line with an odd number of quotes: a quoted field runs over a line end. */
export function rejectOpenQuote(line: string, lineNumber: number, previous?: string): void {
  if (quoteCount(line) % 2 === 0) return;
  const opens = previous !== undefined && quoteCount(previous) % 2 === 1 ? lineNumber - 1 : lineNumber;
  throw new CaptureRejection(
    "quoted-newline",
    "A quoted field runs over a line end (a quote is not closed on its line): sample tables need one row per line",
    { line: opens },
  );
}

/** Rejects a header row that holds hexadecimal values (the first data row, written in hex). */
export function rejectHexHeader(cells: string[], lineNumber: number): void {
  const index = cells.findIndex(isHexCell);
  if (index >= 0) throw hexRejection(cells[index] as string, lineNumber, `#${index + 1}`);
}

/**
 * No dialect found rows of numbers: names what the lines hold instead (hexadecimal values, a quoted
 * field over a line end), else the general message at the last line read.
 */
export function diagnoseNoData(lines: string[]): never {
  let header: string[] = [];
  for (let index = 0; index < lines.length; index++) {
    const line = lines[index] ?? "";
    const cells = DELIMITERS.map((delimiter) => withoutTrailingEmpties(splitLine(line, delimiter))).reduce((a, b) => (b.length > a.length ? b : a));
    const hex = cells.findIndex(isHexCell);
    if (hex >= 0) throw hexRejection(cells[hex] as string, index + 1, header[hex] || `#${hex + 1}`);
    if (cells.length > 0) header = cells;
    rejectOpenQuote(line, index + 1, lines[index - 1]);
  }
  const lastText = lines.findLastIndex((line) => line.trim() !== "");
  throw new CaptureRejection(
    "no-numeric-data",
    "No rows of numbers found: expected a header row followed by rows of numeric samples",
    { line: lastText + 1 },
  );
}
