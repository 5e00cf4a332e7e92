import Papa from "papaparse";
import { isNumericCell } from "./number-syntax";
import { isBareUnitCell } from "./units";

export interface Dialect {
  delimiter: string;
  decimal: "." | ",";
}

const DIALECTS: Dialect[] = [
  { delimiter: ",", decimal: "." },
  { delimiter: ";", decimal: "." },
  { delimiter: ";", decimal: "," },
  { delimiter: "\t", decimal: "." },
  { delimiter: "\t", decimal: "," },
];

/** Rows of numbers that must follow a candidate first data row before it is believed. */
const CONFIRMING_ROWS = 3;
/** Leading columns that may hold key / value / unit metadata beside the data. */
const MAX_LEADING_COLUMNS = 4;

export function splitLine(line: string, delimiter: string): string[] {
  const parsed = Papa.parse<string[]>(line, { delimiter, skipEmptyLines: false });
  return (parsed.data[0] ?? [""]).map((cell) => cell.trim());
}

export function withoutTrailingEmpties(cells: string[]): string[] {
  let end = cells.length;
  while (end > 0 && cells[end - 1] === "") end--;
  return cells.slice(0, end);
}

export function isBlank(line: string, delimiter: string): boolean {
  return line.split(delimiter).every((cell) => cell.trim() === "");
}

/** A cell a person would read as a value, even in a syntax the body parsers refuse (hex, NaN). */
export function looksLikeValue(cell: string, decimal: "." | ","): boolean {
  return isNumericCell(cell, decimal) || /^[+-]?0x[0-9a-f]+$/i.test(cell) || /^[+-]?(nan|inf|infinity)$/i.test(cell);
}

/** Where the rows of numbers start under one dialect, with `skip` leading columns set aside. */
export interface DataStart {
  dialect: Dialect;
  start: number;
  width: number;
  skip: number;
}

function findDataStart(rows: string[][], dialect: Dialect, skip: number): DataStart | null {
  const { decimal } = dialect;
  const numericWidth = (cells: string[]): number => (cells.length > 0 && cells.every((cell) => isNumericCell(cell, decimal)) ? cells.length : 0);
  const looseWidth = (cells: string[]): number => (cells.some((cell) => looksLikeValue(cell, decimal)) ? cells.length : 0);
  for (let start = 0; start < rows.length; start++) {
    const cells = (rows[start] ?? []).slice(skip);
    if ((rows[start] ?? []).length === 0) continue;
    const width = numericWidth(cells);
    if (width === 0) continue;
    let confirmed = 0;
    let consistent = true;
    for (let next = start + 1; next < rows.length && confirmed < CONFIRMING_ROWS; next++) {
      const other = rows[next] ?? [];
      if (other.length === 0) continue;
      if (looseWidth(other.slice(skip)) !== width) {
        consistent = false;
        break;
      }
      confirmed++;
    }
    if (consistent) return { dialect, start, width, skip };
  }
  return null;
}

/** The nearest non-blank row above `start`, past a units row: its cell count (−1 when it holds values). */
function headerWidth(rows: string[][], start: number, found: DataStart): number {
  let index = start - 1;
  while (index >= 0 && (rows[index] ?? []).length === 0) index--;
  const cells = (rows[index] ?? []).slice(found.skip);
  const { decimal } = found.dialect;
  if (cells.length > 0 && cells.every((cell) => cell === "" || looksLikeValue(cell, decimal))) return -1;
  const within = cells.slice(0, found.width);
  if (index >= 1 && within.length > 0 && within.every((cell) => cell === "" || isBareUnitCell(cell)) && cells.slice(found.width).every((cell) => cell === "" || looksLikeValue(cell, decimal))) {
    return headerWidth(rows, index, found);
  }
  return cells.length;
}

/**
 * A single column of decimal-comma numbers also reads as two comma-separated integers. It is taken
 * as decimal commas when no cell has a point or exponent and a second "integer" keeps a leading
 * zero (fraction digits), or the preamble writes its numbers with decimal commas.
 */
function looksLikeDecimalCommas(lines: string[], found: DataStart): boolean {
  if (found.dialect.delimiter !== "," || found.width !== 2 || found.skip !== 0) return false;
  const body = lines.slice(found.start, found.start + 32).filter((line) => line.trim() !== "");
  if (body.some((line) => /[.eE]/.test(line))) return false;
  const leadingZero = body.some((line) => /,0\d/.test(line));
  const preamble = lines.slice(0, found.start).some((line) => /\d,\d/.test(line) && !/\d\.\d/.test(line));
  return leadingZero || preamble;
}

/**
 * Picks the dialect and first data row. A dialect whose header row has as many cells as its data
 * rows is preferred, then the widest data, then the earliest start. When no dialect finds rows of
 * numbers, leading columns (key / value / unit metadata beside the data) are set aside.
 */
export function chooseDataStart(lines: string[]): DataStart | null {
  const byDelimiter = new Map<string, string[][]>();
  const rowsFor = (delimiter: string): string[][] => {
    let rows = byDelimiter.get(delimiter);
    if (!rows) {
      rows = lines.map((line) => (isBlank(line, delimiter) ? [] : withoutTrailingEmpties(splitLine(line, delimiter))));
      byDelimiter.set(delimiter, rows);
    }
    return rows;
  };
  for (let skip = 0; skip <= MAX_LEADING_COLUMNS; skip++) {
    const found: (DataStart & { fits: boolean })[] = [];
    for (const dialect of DIALECTS) {
      const rows = rowsFor(dialect.delimiter);
      const start = findDataStart(rows, dialect, skip);
      if (!start) continue;
      if (skip > 0 && !rows.slice(start.start).some((cells) => cells.slice(0, skip).some((cell) => cell !== ""))) continue;
      const header = headerWidth(rows, start.start, start);
      // Start / Increment cells after the data columns belong to the header region.
      found.push({ ...start, fits: header === start.width || (header > start.width && rows.some((cells) => cells.length > start.width && /start|incr/i.test(cells.join(" ")))) });
    }
    if (found.length === 0) continue;
    const commaTwin = found.find((f) => looksLikeDecimalCommas(lines, f));
    const candidates = commaTwin ? found.filter((f) => f !== commaTwin && f.dialect.decimal === ",") : [];
    const pool = candidates.length > 0 ? candidates : found;
    pool.sort((a, b) => Number(b.fits) - Number(a.fits) || b.width - a.width || a.start - b.start);
    const best = pool[0] as DataStart & { fits: boolean };
    return { dialect: best.dialect, start: best.start, width: best.width, skip: best.skip };
  }
  return null;
}
