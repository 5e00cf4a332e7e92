import Papa from "papaparse";
import { CaptureRejection } from "./rejection";
import { suggestChannelRoles } from "./roles";
import { isBareUnitCell, looksLikeTimeHeader, readHeaderUnit, readQuantity, type HeaderUnit } from "./units";
import { isNumericCell, readNumericCell } from "./number-syntax";
import type { ChannelRole } from "./types";

export interface CaptureLayout {
  delimiter: string;
  decimal: "." | ",";
  /** 0-based index of the first data row among the lines given. */
  dataStartIndex: number;
  /** Every used column, as written (synthesised as "CH1"… when the file has no header row). */
  headers: string[];
  units: HeaderUnit[];
  timeColumn: number | null;
  metadata: Record<string, string>;
  /** From the preamble (sample interval or rate), when given there. */
  preambleSampleRateHz: number | null;
  suggestedRoles: Record<string, ChannelRole>;
}

const DIALECTS: { delimiter: string; decimal: "." | "," }[] = [
  { delimiter: ",", decimal: "." },
  { delimiter: ";", decimal: "." },
  { delimiter: ";", decimal: "," },
  { delimiter: "\t", decimal: "." },
  { delimiter: "\t", decimal: "," },
];

/** Rows of numbers that must follow a candidate first data row before it is believed. */
const CONFIRMING_ROWS = 3;

export function splitLine(line: string, delimiter: string): string[] {
  const parsed = Papa.parse<string[]>(line, { delimiter, skipEmptyLines: false });
  return (parsed.data[0] ?? [""]).map((cell) => cell.trim());
}

function withoutTrailingEmpties(cells: string[]): string[] {
  let end = cells.length;
  while (end > 0 && cells[end - 1] === "") end--;
  return cells.slice(0, end);
}

function isBlank(line: string, delimiter: string): boolean {
  return line.split(delimiter).every((cell) => cell.trim() === "");
}

/** Field count of a row with at least one number in it (a data row with a bad cell still counts). */
function looseWidth(line: string, delimiter: string, decimal: "." | ","): number {
  const cells = withoutTrailingEmpties(splitLine(line, delimiter));
  return cells.some((cell) => isNumericCell(cell, decimal)) ? cells.length : 0;
}

/** Numeric field count of a data row under a dialect, or 0 when the row is not all numbers. */
function numericWidth(line: string, delimiter: string, decimal: "." | ","): number {
  const cells = withoutTrailingEmpties(splitLine(line, delimiter));
  if (cells.length === 0) return 0;
  return cells.every((cell) => isNumericCell(cell, decimal)) ? cells.length : 0;
}

function findDataStart(lines: string[], delimiter: string, decimal: "." | ","): { start: number; width: number } | null {
  for (let start = 0; start < lines.length; start++) {
    const line = lines[start] ?? "";
    if (isBlank(line, delimiter)) continue;
    const width = numericWidth(line, delimiter, decimal);
    if (width === 0) continue;
    let confirmed = 0;
    let consistent = true;
    for (let next = start + 1; next < lines.length && confirmed < CONFIRMING_ROWS; next++) {
      const other = lines[next] ?? "";
      if (isBlank(other, delimiter)) continue;
      if (looseWidth(other, delimiter, decimal) !== width) {
        consistent = false;
        break;
      }
      confirmed++;
    }
    if (consistent) return { start, width };
  }
  return null;
}

function readMetadataLine(line: string, delimiter: string): [string, string] | null {
  const text = line.replace(/^\s*[#%;"']+\s*/, "").trim();
  if (text === "") return null;
  const cells = withoutTrailingEmpties(splitLine(text, delimiter));
  if (cells.length >= 2 && cells[0]) {
    return [cells[0].replace(/[:=]\s*$/, "").trim(), cells.slice(1).filter((c) => c !== "").join(" ")];
  }
  const match = /^([^:=]+)[:=]\s*(.*)$/.exec(text);
  if (match && match[1]) return [match[1].trim(), (match[2] ?? "").trim()];
  return [text, ""];
}

const INTERVAL_KEY = /(sample|sampling)?\s*(interval|period)|x\s*incr|delta\s*t|^dt$|time\s*(per|\/)\s*(sample|point)|^tinc/i;
const RATE_KEY = /(sample|sampling)\s*(rate|freq)|^fs$|samples?\s*per\s*second/i;

function sampleRateFromMetadata(metadata: Record<string, string>, decimal: "." | ","): number | null {
  for (const [key, value] of Object.entries(metadata)) {
    const quantity = readQuantity(value, decimal) ?? readQuantity(value, ".");
    if (!quantity || !(quantity.value > 0)) continue;
    if (RATE_KEY.test(key) && quantity.unit !== "s") return quantity.value;
    if (INTERVAL_KEY.test(key) && quantity.unit !== "Hz") return 1 / quantity.value;
  }
  return null;
}

/** When there is no header row: a first column that rises in even steps is taken as time. */
function firstColumnIsTime(rows: number[][]): boolean {
  if (rows.length < 3 || (rows[0]?.length ?? 0) < 2) return false;
  const first = rows.map((row) => row[0] ?? Number.NaN);
  const step = (first[1] ?? 0) - (first[0] ?? 0);
  if (!(step > 0)) return false;
  return first.every((value, index) => index === 0 || Math.abs(value - (first[index - 1] ?? 0) - step) <= 0.01 * step);
}

/** Works out the dialect, preamble, header and time base from the first lines of a capture. */
export function sniffLines(lines: string[]): CaptureLayout {
  if (lines.every((line) => line.trim() === "")) throw new CaptureRejection("empty", "The file is empty");
  let best: { dialect: (typeof DIALECTS)[number]; start: number; width: number } | null = null;
  for (const dialect of DIALECTS) {
    const found = findDataStart(lines, dialect.delimiter, dialect.decimal);
    if (!found) continue;
    if (!best || found.width > best.width || (found.width === best.width && found.start < best.start)) {
      best = { dialect, ...found };
    }
  }
  if (!best) {
    const lastText = lines.findLastIndex((line) => line.trim() !== "");
    throw new CaptureRejection(
      "no-numeric-data",
      "No rows of numbers found: expected a header row followed by rows of numeric samples",
      { line: lastText + 1 },
    );
  }
  const { delimiter, decimal } = best.dialect;
  let headerIndex = best.start - 1;
  while (headerIndex >= 0 && isBlank(lines[headerIndex] ?? "", delimiter)) headerIndex--;
  let unitRow: string[] | null = null;
  if (headerIndex >= 1) {
    const cells = withoutTrailingEmpties(splitLine(lines[headerIndex] ?? "", delimiter));
    if (cells.length > 0 && cells.every((cell) => cell === "" || isBareUnitCell(cell))) {
      unitRow = cells;
      headerIndex--;
    }
  }
  let headers: string[] = headerIndex >= 0 ? withoutTrailingEmpties(splitLine(lines[headerIndex] ?? "", delimiter)) : [];
  const metadata: Record<string, string> = {};
  for (let index = 0; index < Math.max(headerIndex, 0); index++) {
    const entry = readMetadataLine(lines[index] ?? "", delimiter);
    if (entry && !(entry[0] in metadata)) metadata[entry[0]] = entry[1];
  }
  const hasHeader = headers.length > 0;
  const width = Math.max(best.width, headers.length);
  headers = Array.from({ length: width }, (_, index) => headers[index] || `CH${index + 1}`);
  const units = headers.map((header, index) => {
    const unit = readHeaderUnit(header);
    const rowUnit = unitRow?.[index];
    if (unit.written === null && rowUnit) {
      const fromRow = readHeaderUnit(`${header} (${rowUnit.replace(/^[([]\s*|\s*[)\]]$/g, "")})`);
      return { ...fromRow, name: unit.name };
    }
    return unit;
  });
  let timeColumn: number | null = units.findIndex((unit) => looksLikeTimeHeader(unit));
  if (timeColumn < 0) timeColumn = null;
  if (!hasHeader) {
    const rows = lines
      .slice(best.start, best.start + 8)
      .filter((line) => !isBlank(line, delimiter))
      .map((line) => withoutTrailingEmpties(splitLine(line, delimiter)).map((cell) => readNumericCell(cell, decimal)));
    if (firstColumnIsTime(rows)) {
      headers[0] = "time";
      units[0] = { name: "time", kind: "time", factor: 1, written: null };
      timeColumn = 0;
    }
  }
  const channelHeaders = headers.filter((_, index) => index !== timeColumn);
  return {
    delimiter,
    decimal,
    dataStartIndex: best.start,
    headers,
    units,
    timeColumn,
    metadata,
    preambleSampleRateHz: sampleRateFromMetadata(metadata, decimal),
    suggestedRoles: suggestChannelRoles(channelHeaders),
  };
}

/**
 * For the upload form: reads the first bytes of a capture (as text) and reports the dialect,
 * headers, preamble metadata and suggested roles. Pure and browser-safe.
 */
export function sniffCaptureHeader(firstBytes: string): {
  delimiter: string;
  decimal: "." | ",";
  headers: string[];
  metadata: Record<string, string>;
  suggestedRoles: Record<string, ChannelRole>;
} {
  const text = firstBytes.replace(/^\uFEFF/, "");
  const lines = text.split(/\r?\n/);
  if (lines.length > 1 && !/\n$/.test(text)) lines.pop();
  const layout = sniffLines(lines);
  return {
    delimiter: layout.delimiter,
    decimal: layout.decimal,
    headers: layout.headers,
    metadata: layout.metadata,
    suggestedRoles: layout.suggestedRoles,
  };
}
