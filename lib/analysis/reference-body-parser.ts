import Papa from "papaparse";
import { CaptureRejection } from "./rejection";
import { badCell, quotedNewline } from "./bad-cell";
import { isNumericCell, quoteCell, readNumericCell } from "./number-syntax";
import type { ColumnSink } from "./column-sink";
import type { BodyParser } from "./fast-body-parser";

/**
 * The reference path: papaparse splits the body, `Number()` reads each cell. It keeps the body
 * text until `finish`, so it is meant for tests and small inputs; the fast path must agree with it.
 */
export function createReferenceBodyParser(
  sink: ColumnSink,
  headers: readonly string[],
  delimiter: string,
  decimal: "." | ",",
  firstLine: number,
  leadingColumns = 0,
): BodyParser {
  const decoder = new TextDecoder();
  const parts: string[] = [];
  const width = headers.length;
  const row = new Float64Array(width);
  return {
    push(chunk: Uint8Array): void {
      parts.push(decoder.decode(chunk, { stream: true }));
    },
    finish(): void {
      parts.push(decoder.decode());
      const parsed = Papa.parse<string[]>(parts.join(""), { delimiter, skipEmptyLines: false });
      parsed.data.forEach((fields, index) => {
        const line = firstLine + index;
        const cells = fields.slice(leadingColumns);
        let filled = 0;
        for (let column = 0; column < Math.max(width, cells.length); column++) {
          const raw = cells[column] ?? "";
          if (/[\r\n]/.test(raw)) throw quotedNewline(line, headers[column] ?? `#${column + 1}`);
          const cell = raw.trim();
          if (cell === "") {
            if (column < width) row[column] = Number.NaN;
            continue;
          }
          if (column >= width) {
            throw new CaptureRejection("unexpected-field", `Value ${quoteCell(cell)} beyond the last column of the header`, {
              line,
              column: `#${column + 1}`,
            });
          }
          if (!isNumericCell(cell, decimal) || !Number.isFinite(readNumericCell(cell, decimal))) {
            throw badCell(cell, line, headers[column] ?? `#${column + 1}`);
          }
          row[column] = readNumericCell(cell, decimal);
          filled++;
        }
        if (filled > 0) sink.accept(row, line, filled);
      });
    },
  };
}
