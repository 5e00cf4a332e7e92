import { hexRejection, isHexCell } from "./head-diagnosis";
import { quoteCell } from "./number-syntax";
import { CaptureRejection } from "./rejection";

/** The rejection for a body cell that is not a number: hexadecimal named as such. */
export function badCell(cell: string, line: number, column: string): CaptureRejection {
  if (isHexCell(cell)) return hexRejection(cell, line, column);
  return new CaptureRejection("non-numeric", `Not a number: ${quoteCell(cell)}`, { line, column });
}

export function quotedNewline(line: number, column: string): CaptureRejection {
  return new CaptureRejection(
    "quoted-newline",
    "A quoted field runs over a line end (a quote is not closed on its line): sample tables need one row per line",
    { line, column },
  );
}
